/**
 * JSON.stringify(project), built in steps: everything but the score grid at once (small), then the
 * grid a few hundred rows per step, so runInSlices can spread a large course (tens of megabytes of
 * JSON at 10 000 students × 60 assessments) over many short tasks. The text is exactly
 * JSON.stringify's (tests/state/projectJson.test.ts).
 *
 * The grid's place is found through a marker string; if the course happens to contain the marker's
 * text itself, the whole course is stringified in one step instead.
 */
import type { CourseProject } from '../bridge/contract';

const MARKER = '\u0000weighbridge-score-grid\u0000';

export function* projectJsonSteps(project: CourseProject, rowsPerStep = 200): Generator<void, string> {
  const head = JSON.stringify({ ...project, gradebook: { ...project.gradebook, scores: MARKER } });
  const marker = JSON.stringify(MARKER);
  const at = head.indexOf(marker);
  if (at < 0 || head.indexOf(marker, at + 1) >= 0) return JSON.stringify(project);
  const rows = project.gradebook.scores;
  const parts: string[] = [];
  for (let i = 0; i < rows.length; i += rowsPerStep) {
    yield;
    const end = Math.min(rows.length, i + rowsPerStep);
    for (let r = i; r < end; r++) parts.push(JSON.stringify(rows[r]) ?? 'null'); // as an array element
  }
  return `${head.slice(0, at)}[${parts.join(',')}]${head.slice(at + marker.length)}`;
}
