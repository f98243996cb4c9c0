export type {
  ListeningReport,
  ReportCoil,
  ReportGuitar,
  ReportRender,
  ReportWiring,
} from './listening-report.js';
