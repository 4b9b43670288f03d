import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { loadPlanFile, parsePlanText, savePlanFile, serialisePlan } from '../../../main/services/project';
import { sampleProject } from './sampleProject';

let dir: string;
beforeEach(async () => {
  dir = await mkdtemp(join(tmpdir(), 'wb-plan-'));
});
afterEach(async () => {
  await rm(dir, { recursive: true, force: true });
});

describe('plan file', () => {
  it('round-trips a plan and keeps the previous copy', async () => {
    const path = join(dir, 'course.plan.json');
    const plan = sampleProject().plan;
    expect(await savePlanFile(path, plan)).toEqual({ ok: true, value: { path } });
    const doc = JSON.parse(await readFile(path, 'utf8')) as Record<string, unknown>;
    expect(Object.keys(doc)).toEqual(['format', 'schemaVersion', 'plan']);
    expect(doc['format']).toBe('weighbridge-plan');
    expect(await loadPlanFile(path)).toEqual({ ok: true, value: plan });
    const firstBytes = await readFile(path);
    await savePlanFile(path, { ...plan, markMode: 'projected' });
    expect(await readFile(`${path}.bak`)).toEqual(firstBytes);
  });

  it('refuses newer schemas, damaged fields and project files', async () => {
    const text = serialisePlan(sampleProject().plan);
    const newer = parsePlanText(text.replace('"schemaVersion": 1', '"schemaVersion": 2'));
    expect(!newer.ok && newer.code).toBe('newer-schema');
    const damaged = parsePlanText(text.replace('"markMode": "current"', '"markMode": "sometimes"'));
    expect(!damaged.ok && damaged.code).toBe('damaged');
    if (!damaged.ok) expect(damaged.message).toContain('plan.markMode');
    const path = join(dir, 'p.json');
    await writeFile(path, '{"format":"weighbridge-project","schemaVersion":1}');
    const wrong = await loadPlanFile(path);
    expect(!wrong.ok && wrong.code).toBe('bad-input');
    if (!wrong.ok) expect(wrong.message).toContain('It is a project file');
  });

  it('reads the demo course plan shipped in demo-data/', async () => {
    const demo = fileURLToPath(new URL('../../../demo-data/glaciology-231.plan.json', import.meta.url));
    const r = await loadPlanFile(demo);
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.value.categories.length).toBeGreaterThan(0);
  });
});
