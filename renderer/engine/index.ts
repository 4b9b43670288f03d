/**
 * The engine: grading rules and statistics as pure TypeScript (no React, DOM, Node or I/O).
 * Read `grading/gradeCourse.ts` for the pipeline and `grading/README.md` for the decisions.
 */
export type * from './model';
export type * from './results';
export { defined, notDefined, valueOrNull, type Defined } from './defined';
export * from './grading/index';
export * as stats from './stats/index';
