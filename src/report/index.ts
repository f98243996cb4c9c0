export type {
  ListeningReport,
  ReportCoil,
  ReportGroups,
  ReportGuitar,
  ReportRender,
  ReportSwitchPosition,
  ReportWiring,
} from './listening-report.js';
export { renderListeningPage } from './render-listening-page.js';
export { escapeHtml, serializeJsonForScript } from './escape-html.js';
export { reportGuitar, describeControls, formatPosition } from './report-guitar.js';
export { renderGroupsSection } from './page-groups.js';
export type { ComparisonDifference, ComparisonEntry, ComparisonReport, ComparisonRow, ComparisonSetReport } from './comparison-report.js';
export { renderComparisonPage } from './render-comparison-page.js';
export { escapeMarkdown } from './escape-markdown.js';
export { StreamedArray, mapIterable, writeJson, writeJsonPausing } from './write-json.js';
