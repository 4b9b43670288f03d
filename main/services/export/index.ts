/** Final-marks export with formula-injection defence. */
export { exportFinals, writeExport, checkTargets, csvSiblingPath, type ExportOutcome } from './exportFinals';
export { neutraliseCell, needsNeutralising, stripNeutraliser } from './neutralise';
export {
  assessmentStatisticsTable,
  breakdownTable,
  finalsTable,
  gradeProject,
  gradeProjectFinalsOnly,
  sectionStatisticsTable,
  undefinedReasons,
  type CellValue,
  type GradedCourse,
  type Table,
} from './tables';
export { tableToCsv, tablesToXlsx } from './writers';
export { exportCsvRows, type CsvRowsTarget } from './streamCsv';
export { csvLines } from './writers';
