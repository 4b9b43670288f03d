import { mkdtemp, readFile, rm, symlink, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { loadProject, parseProjectText, saveProject, serialiseProject } from '../../../main/services/project';
import { sampleProject } from './sampleProject';

let dir: string;
beforeEach(async () => {
  dir = await mkdtemp(join(tmpdir(), 'wb-project-'));
});
afterEach(async () => {
  await rm(dir, { recursive: true, force: true });
});

const fixedNow = (iso: string) => () => new Date(iso);

describe('project file', () => {
  it('round-trips a course exactly', async () => {
    const path = join(dir, 'course.weighbridge');
    const project = sampleProject();
    const saved = await saveProject(path, project, { now: fixedNow('2025-03-01T10:00:00.000Z') });
    expect(saved).toEqual({ ok: true, value: { path, savedAt: '2025-03-01T10:00:00.000Z' } });
    const text = await readFile(path, 'utf8');
    const doc = JSON.parse(text) as Record<string, unknown>;
    expect(doc['format']).toBe('weighbridge-project');
    expect(doc['schemaVersion']).toBe(1);
    expect(doc['savedAt']).toBe('2025-03-01T10:00:00.000Z');
    const loaded = await loadProject(path);
    expect(loaded).toEqual({ ok: true, value: project });
  });

  it('keeps the previous good copy as <name>.bak', async () => {
    const path = join(dir, 'course.weighbridge');
    const first = sampleProject({ title: 'first' });
    await saveProject(path, first, { now: fixedNow('2025-03-01T10:00:00.000Z') });
    const firstBytes = await readFile(path);
    await saveProject(path, sampleProject({ title: 'second' }), { now: fixedNow('2025-03-02T10:00:00.000Z') });
    expect(await readFile(`${path}.bak`)).toEqual(firstBytes);
    const second = await loadProject(path);
    expect(second.ok && second.value.title).toBe('second');
  });

  it('never replaces a good backup with a damaged file', async () => {
    const path = join(dir, 'course.weighbridge');
    await saveProject(path, sampleProject({ title: 'first' }));
    await saveProject(path, sampleProject({ title: 'second' }));
    const goodBackup = await readFile(`${path}.bak`);
    await writeFile(path, '{"format":"weighbridge-project","schemaVersion":1,"savedAt":"x","proj');
    const r = await saveProject(path, sampleProject({ title: 'third' }));
    expect(r.ok).toBe(true);
    expect(await readFile(`${path}.bak`)).toEqual(goodBackup);
  });

  it('refuses to write the source spreadsheet, also through a symbolic link', async () => {
    const sheet = join(dir, 'scores.xlsx');
    await writeFile(sheet, 'original bytes');
    const source = { path: sheet, fileName: 'scores.xlsx', sha256: 'a'.repeat(64), importedAt: '2025-01-01T00:00:00Z', layout: { sheets: [], sectionFrom: 'column' as const, tokens: { excused: [], missing: [], pending: [] } } };
    const project = sampleProject({ source });
    const direct = await saveProject(sheet, project);
    expect(direct.ok).toBe(false);
    if (!direct.ok) {
      expect(direct.code).toBe('bad-input');
      expect(direct.message).toContain('source spreadsheet');
    }
    const link = join(dir, 'link.weighbridge');
    await symlink(sheet, link);
    expect((await saveProject(link, project)).ok).toBe(false);
    expect(await readFile(sheet, 'utf8')).toBe('original bytes');
  });

  it('refuses to save an inconsistent course and writes nothing', async () => {
    const path = join(dir, 'bad.weighbridge');
    const p = sampleProject();
    const broken = { ...p, gradebook: { ...p.gradebook, scores: p.gradebook.scores.slice(1) } };
    const r = await saveProject(path, broken);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toContain('project.gradebook.scores');
    await expect(readFile(path)).rejects.toThrow();
  });

  it('refuses a file from a newer schema with code newer-schema', () => {
    const text = serialiseProject(sampleProject(), '2025-01-01T00:00:00.000Z').replace('"schemaVersion": 1', '"schemaVersion": 7');
    const r = parseProjectText(text);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.code).toBe('newer-schema');
      expect(r.message).toContain('file schema 7; this version reads up to 1');
    }
  });

  it('reports damaged JSON and invalid fields with the field path, never half-loading', () => {
    const good = serialiseProject(sampleProject(), '2025-01-01T00:00:00.000Z');
    const truncated = parseProjectText(good.slice(0, good.length / 2));
    expect(truncated.ok).toBe(false);
    if (!truncated.ok) expect(truncated.code).toBe('damaged');

    const doc = JSON.parse(good) as { project: { gradebook: { scores: unknown[][] } } };
    doc.project.gradebook.scores[2]![1] = { kind: 'earned', points: '7' };
    const badField = parseProjectText(JSON.stringify(doc));
    expect(badField.ok).toBe(false);
    if (!badField.ok) {
      expect(badField.code).toBe('damaged');
      expect(badField.message).toContain('project.gradebook.scores[2][1]');
      expect(badField).not.toHaveProperty('value');
    }
  });

  it('refuses a file carrying a __proto__ key and leaves Object.prototype untouched', () => {
    const good = serialiseProject(sampleProject(), '2025-01-01T00:00:00.000Z');
    const crafted = good.replace('"notes":', '"__proto__": { "polluted": true }, "notes":');
    const r = parseProjectText(crafted);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.code).toBe('damaged');
    expect(({} as Record<string, unknown>)['polluted']).toBeUndefined();
  });

  it('tells a plan file or a foreign JSON file from a project file', () => {
    const plan = parseProjectText('{"format":"weighbridge-plan","schemaVersion":1,"plan":{}}');
    expect(plan.ok).toBe(false);
    if (!plan.ok) {
      expect(plan.code).toBe('bad-input');
      expect(plan.message).toContain('grading plan file');
    }
    const foreign = parseProjectText('{"name":"package"}');
    expect(foreign.ok).toBe(false);
    if (!foreign.ok) expect(foreign.code).toBe('bad-input');
  });

  it('accepts a UTF-8 byte-order mark (a file re-saved by a text editor)', () => {
    const good = serialiseProject(sampleProject(), '2025-01-01T00:00:00.000Z');
    expect(parseProjectText(`\uFEFF${good}`).ok).toBe(true);
  });

  it('reports a missing file as not-found and bad UTF-8 as damaged', async () => {
    const missing = await loadProject(join(dir, 'nope.weighbridge'));
    expect(missing.ok).toBe(false);
    if (!missing.ok) expect(missing.code).toBe('not-found');
    const latin = join(dir, 'latin.weighbridge');
    await writeFile(latin, Buffer.from([0x7b, 0x22, 0xe9, 0x22, 0x7d]));
    const r = await loadProject(latin);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.code).toBe('damaged');
    const folder = await loadProject(dir);
    expect(folder.ok).toBe(false);
  });
});
