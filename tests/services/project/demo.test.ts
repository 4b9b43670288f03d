import { mkdtemp, rm, writeFile, mkdir } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { demoCoursePaths, findAppRoot, loadDemoCourse } from '../../../main/services/demo';
import { courseProjectSchema } from '../../../main/services/schemas';

const repoRoot = fileURLToPath(new URL('../../../', import.meta.url)).replace(/\/$/, '');

describe('demo course', () => {
  it('finds the app root by walking up to the weighbridge package.json', async () => {
    expect(findAppRoot()).toBe(repoRoot);
    expect(findAppRoot(join(repoRoot, 'main', 'services'))).toBe(repoRoot);
    const foreign = await mkdtemp(join(tmpdir(), 'wb-root-'));
    try {
      await writeFile(join(foreign, 'package.json'), '{"name":"something-else"}');
      await mkdir(join(foreign, 'deep'));
      expect(findAppRoot(join(foreign, 'deep'))).toBe(null);
    } finally {
      await rm(foreign, { recursive: true, force: true });
    }
    const paths = demoCoursePaths(repoRoot);
    expect(paths.ok && paths.value.plan).toBe(join(repoRoot, 'demo-data', 'glaciology-231.plan.json'));
  });

  it('loads the demo xlsx with its plan as a valid project', async () => {
    const r = await loadDemoCourse();
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(courseProjectSchema.safeParse(r.value).success).toBe(true);
    expect(r.value.gradebook.students.length).toBeGreaterThan(10);
    // Every assessment the plan names exists in the imported gradebook.
    const ids = new Set(r.value.gradebook.assessments.map((a) => a.id));
    for (const id of Object.keys(r.value.plan.items)) expect(ids).toContain(id);
  });
});
