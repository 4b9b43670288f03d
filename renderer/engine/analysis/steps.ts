/**
 * Analyses that take long on a large course are written as step generators (comparisonSteps,
 * itemAnalysisSteps): they yield between independent pieces of work, so the window can spread
 * them over several tasks and stay responsive. The plain functions run the same generator to its
 * end, so both give one and the same result.
 */

/** Drives a step generator to its end and returns what it returns. */
export function runSteps<T>(steps: Generator<unknown, T>): T {
  for (;;) {
    const next = steps.next();
    if (next.done === true) return next.value;
  }
}
