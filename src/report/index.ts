export type {
  ListeningReport,
  ReportCoil,
  ReportGroups,
  ReportGuitar,
  ReportRender,
  ReportWiring,
} from './listening-report.js';
export { renderListeningPage } from './render-listening-page.js';
export { pageAudioPath, renderPageAudioScript, PAGE_AUDIO_CALLBACK } from './page-audio-file.js';
export { escapeHtml, serializeJsonForScript } from './escape-html.js';
export { reportGuitar, describeControls, formatPosition } from './report-guitar.js';
export { renderGroupsSection } from './page-groups.js';
export type { ComparisonDifference, ComparisonEntry, ComparisonReport, ComparisonRow, ComparisonSetReport } from './comparison-report.js';
export { renderComparisonPage } from './render-comparison-page.js';
export { planComparisonGains } from './plan-comparison-gains.js';
export type { ComparisonGains } from './plan-comparison-gains.js';
export { escapeMarkdown } from './escape-markdown.js';
