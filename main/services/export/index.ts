/** Final-marks export with formula-injection defence. */
export { exportFinals, csvSiblingPath, type ExportOutcome } from './exportFinals';
export { neutraliseCell, needsNeutralising, stripNeutraliser } from './neutralise';
export {
  assessmentStatisticsTable,
  breakdownTable,
  finalsTable,
  gradeProject,
  sectionStatisticsTable,
  undefinedReasons,
  type CellValue,
  type GradedCourse,
  type Table,
} from './tables';
export { tableToCsv, tablesToXlsx } from './writers';
