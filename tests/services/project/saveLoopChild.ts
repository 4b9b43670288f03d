/**
 * Child process for the crash test: saves two known versions of a course alternately, forever,
 * until the parent kills it with SIGKILL. Prints "ready" once the first save has completed.
 * Usage: node saveLoopChild.mjs <project path>
 */
import { saveProject } from '../../../main/services/project';
import { crashVersions } from './crashVersions';

const path = process.argv[2];
if (!path) throw new Error('usage: saveLoopChild <path>');
const versions = crashVersions();
let i = 0;
for (;;) {
  const v = versions[i % 2]!;
  const r = await saveProject(path, v.project, { now: () => new Date(v.savedAt) });
  if (!r.ok) {
    process.stderr.write(`${r.message}\n`);
    process.exit(3);
  }
  if (i === 0) process.stdout.write('ready\n');
  i += 1;
}
