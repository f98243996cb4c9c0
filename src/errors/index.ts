export { InputError, WorkError, formatProblem, problemAt, showValue } from './input-error.js';
export type { InputProblem } from './input-error.js';
export { MAX_SHOWN_TEXT, escapeForMessage, revealHiddenCharacters } from './escape-text.js';
export { describeFileSystemCode, fileSystemCodeOf, isPathProblem } from './file-system-words.js';
export { MAX_SUGGESTION_EDITS, closestName, editDistance, listWithSuggestion, oneOfChoices } from './closest-name.js';
