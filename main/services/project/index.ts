/** Project and plan files: versioned, validated, saved atomically with the previous copy kept. */
export {
  PROJECT_FILE_EXTENSION,
  PROJECT_FORMAT,
  PROJECT_SCHEMA_VERSION,
  backupPathFor,
  loadProject,
  parseProjectText,
  projectDocumentSchema,
  projectFormat,
  projectMigrations,
  saveProject,
  serialiseProject,
  type ProjectDocument,
  type SaveOptions,
} from './projectFile';
export { PLAN_FORMAT, PLAN_SCHEMA_VERSION, loadPlanFile, parsePlanText, planDocumentSchema, planMigrations, savePlanFile, serialisePlan } from './planFile';
export { parseVersioned, MAX_JSON_FILE_BYTES, type Migration, type VersionedFormat, type ParsedDocument } from './versionedFile';
export { keepBackup, sameFile, writeAtomic } from './atomicWrite';
export { fail, ok, ioFailure } from './result';
