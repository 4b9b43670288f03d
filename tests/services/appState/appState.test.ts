import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createRecentFiles, createRecoveryStore, RECENT_FILE_NAME, RECOVERY_FILE_NAME } from '../../../main/services/appState';
import { sampleProject } from '../project/sampleProject';

let dir: string;
beforeEach(async () => {
  dir = await mkdtemp(join(tmpdir(), 'wb-appstate-'));
});
afterEach(async () => {
  await rm(dir, { recursive: true, force: true });
});

describe('recovery store', () => {
  it('has nothing to offer before the first write', async () => {
    expect(await createRecoveryStore(join(dir, 'not-yet-created')).read()).toEqual({ ok: true, value: null });
  });

  it('writes, reads back exactly, and discards', async () => {
    const store = createRecoveryStore(join(dir, 'state'), () => new Date('2025-05-05T05:05:05.000Z'));
    const project = sampleProject();
    expect(await store.write('/courses/geo.weighbridge', project)).toEqual({ ok: true, value: { savedAt: '2025-05-05T05:05:05.000Z' } });
    expect(await store.read()).toEqual({ ok: true, value: { savedAt: '2025-05-05T05:05:05.000Z', projectPath: '/courses/geo.weighbridge', project } });
    await store.write(null, { ...project, title: 'never saved' });
    const second = await store.read();
    expect(second.ok && second.value?.projectPath).toBe(null);
    expect(second.ok && second.value?.project.title).toBe('never saved');
    expect(await store.discard()).toEqual({ ok: true, value: null });
    expect(await store.read()).toEqual({ ok: true, value: null });
    expect((await store.discard()).ok).toBe(true);
  });

  it('writes a course sent as JSON text exactly as the course itself, and refuses text that is not a valid course', async () => {
    const store = createRecoveryStore(join(dir, 'state'), () => new Date('2025-05-05T05:05:05.000Z'));
    const project = sampleProject();
    expect(await store.writeJson(null, JSON.stringify(project))).toEqual({ ok: true, value: { savedAt: '2025-05-05T05:05:05.000Z' } });
    expect(await store.read()).toEqual({ ok: true, value: { savedAt: '2025-05-05T05:05:05.000Z', projectPath: null, project } });
    const notJson = await store.writeJson(null, '{"title": ');
    expect(notJson.ok).toBe(false);
    if (!notJson.ok) expect(notJson.message).toBe('The recovery copy was not written: the course sent for it is not valid JSON.');
    const notACourse = await store.writeJson(null, JSON.stringify({ ...project, gradebook: { ...project.gradebook, scores: 'none' } }));
    expect(notACourse.ok).toBe(false);
    // Neither refusal touched the copy already written.
    expect(await store.read()).toEqual({ ok: true, value: { savedAt: '2025-05-05T05:05:05.000Z', projectPath: null, project } });
  });

  it('reports a damaged recovery copy instead of loading it', async () => {
    const store = createRecoveryStore(dir);
    await store.write(null, sampleProject());
    const file = join(dir, RECOVERY_FILE_NAME);
    const text = await readFile(file, 'utf8');
    await writeFile(file, text.replace('"kind":"earned","points":8', '"kind":"earned","points":"8"'));
    const r = await store.read();
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.code).toBe('damaged');
      expect(r.message).toContain('project.gradebook.scores[0][0]');
    }
    await writeFile(file, text.slice(0, 100));
    const torn = await store.read();
    expect(!torn.ok && torn.code).toBe('damaged');
  });

  it('refuses to write an inconsistent course', async () => {
    const p = sampleProject();
    const r = await createRecoveryStore(dir).write(null, { ...p, gradebook: { ...p.gradebook, scores: [] } });
    expect(!r.ok && r.code).toBe('bad-input');
  });
});

describe('recent files', () => {
  it('keeps absolute paths, most recent first, without duplicates, at most max', async () => {
    const recent = createRecentFiles(dir, 3);
    expect(await recent.list()).toEqual({ ok: true, value: [] });
    await recent.add('/a.weighbridge');
    await recent.add('/b.weighbridge');
    await recent.add('/a.weighbridge');
    expect(await recent.list()).toEqual({ ok: true, value: ['/a.weighbridge', '/b.weighbridge'] });
    await recent.add('/c.weighbridge');
    await recent.add('relative.weighbridge');
    expect(await recent.list()).toEqual({ ok: true, value: [resolve('relative.weighbridge'), '/c.weighbridge', '/a.weighbridge'] });
    await recent.remove('/c.weighbridge');
    expect(await recent.list()).toEqual({ ok: true, value: [resolve('relative.weighbridge'), '/a.weighbridge'] });
  });

  it('reports a damaged list and replaces it on the next add', async () => {
    await writeFile(join(dir, RECENT_FILE_NAME), '{"format":"weighbridge-recent","schemaVersion":1,"paths":[42]}');
    const recent = createRecentFiles(dir);
    const r = await recent.list();
    expect(!r.ok && r.code).toBe('damaged');
    if (!r.ok) expect(r.message).toContain('paths[0]');
    expect(await recent.add('/x.weighbridge')).toEqual({ ok: true, value: ['/x.weighbridge'] });
    expect(await recent.list()).toEqual({ ok: true, value: ['/x.weighbridge'] });
  });
});
