/** The declared-size check lives with the spreadsheet reader, which runs it on every path. */
export { declaredUnzippedBytes } from '../spreadsheet/zipCheck';
