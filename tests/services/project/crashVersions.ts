/** The two versions the crash-test child alternates between (old and new). */
import type { CourseProject } from '../../../renderer/bridge/contract';
import { sampleProject } from './sampleProject';

export function crashVersions(): readonly { project: CourseProject; savedAt: string }[] {
  const big = sampleProject();
  // Make the file large enough (~100 kB) that a kill often lands while bytes are being written.
  const notes = 'x'.repeat(50_000);
  return [
    { project: { ...big, title: 'version A', notes: `A${notes}` }, savedAt: '2025-01-01T00:00:00.000Z' },
    { project: { ...big, title: 'version B', notes: `B${notes}${notes}` }, savedAt: '2025-01-02T00:00:00.000Z' },
  ];
}
