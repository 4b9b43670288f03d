/**
 * Real calls through the IPC table into the real main/services, against temp folders: what the
 * Electron window and the browser harness do, minus the transport. Checks round trips and
 * refusals, not grading values (the engine's tests own those).
 */
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CourseProject, Result, WorkbookPreview } from '../../renderer/bridge/contract';
import { createBridgeHandlers, dispatchBridgeCall, type BridgeHandlers } from '../../main/ipc/index';

const root = resolve(import.meta.dirname, '../..');
const demoXlsx = join(root, 'demo-data', 'glaciology-231.xlsx');
const demoCsv = join(root, 'demo-data', 'glaciology-231.csv');
const sha = (path: string) => createHash('sha256').update(readFileSync(path)).digest('hex');

let work = '';
let handlers: BridgeHandlers;
let demo: CourseProject;

function value<T>(result: Result<unknown>): T {
  if (!result.ok) throw new Error(`${result.code}: ${result.message}`);
  return result.value as T;
}

beforeAll(async () => {
  work = mkdtempSync(join(tmpdir(), 'wb-ipc-'));
  handlers = createBridgeHandlers({ userDataDir: join(work, 'userData'), dialogs: null, appRoot: root });
  demo = value<CourseProject>(await dispatchBridgeCall(handlers, 'demoCourse', []));
});

afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('bridge over the real services', () => {
  it('opens the demo course with a gradebook and a plan', () => {
    expect(demo.gradebook.students.length).toBeGreaterThan(0);
    expect(demo.gradebook.scores).toHaveLength(demo.gradebook.students.length);
    expect(demo.plan.categories.length).toBeGreaterThan(0);
  });

  it('starts with no recent files and no recovery copy', async () => {
    const fresh = createBridgeHandlers({ userDataDir: join(work, 'fresh'), dialogs: null, appRoot: root });
    expect(await dispatchBridgeCall(fresh, 'recentFiles', [])).toEqual({ ok: true, value: [] });
    expect(await dispatchBridgeCall(fresh, 'readRecovery', [])).toEqual({ ok: true, value: null });
  });

  it('saves a project, loads it back equal, and lists it in recent files', async () => {
    const path = join(work, 'course.weighbridge');
    const saved = value<{ path: string; savedAt: string }>(await dispatchBridgeCall(handlers, 'saveProject', [path, demo]));
    expect(saved.path).toBe(path);
    const loaded = value<CourseProject>(await dispatchBridgeCall(handlers, 'loadProject', [path]));
    expect(loaded).toEqual(demo);
    expect(value<string[]>(await dispatchBridgeCall(handlers, 'recentFiles', []))[0]).toBe(path);
  });

  it('previews a spreadsheet without changing it, and lists it in recent files', async () => {
    const before = sha(demoCsv);
    const preview = value<WorkbookPreview>(await dispatchBridgeCall(handlers, 'previewSpreadsheet', [demoCsv]));
    expect(preview.path).toBe(demoCsv);
    expect(preview.sha256).toBe(before);
    expect(sha(demoCsv)).toBe(before);
    expect(value<string[]>(await dispatchBridgeCall(handlers, 'recentFiles', []))[0]).toBe(demoCsv);
  });

  it('imports a spreadsheet with the detected layout', async () => {
    const preview = value<WorkbookPreview>(await dispatchBridgeCall(handlers, 'previewSpreadsheet', [demoXlsx]));
    const imported = value<{ gradebook: CourseProject['gradebook'] }>(await dispatchBridgeCall(handlers, 'importSpreadsheet', [demoXlsx, preview.detected]));
    expect(imported.gradebook.students.length).toBe(demo.gradebook.students.length);
  });

  it('writes, reads and discards the recovery copy', async () => {
    const written = value<{ savedAt: string }>(await dispatchBridgeCall(handlers, 'writeRecovery', [null, JSON.stringify(demo)]));
    const read = value<{ savedAt: string; projectPath: string | null; project: CourseProject }>(await dispatchBridgeCall(handlers, 'readRecovery', []));
    expect(read).toEqual({ savedAt: written.savedAt, projectPath: null, project: demo });
    expect(await dispatchBridgeCall(handlers, 'discardRecovery', [])).toEqual({ ok: true, value: null });
    expect(await dispatchBridgeCall(handlers, 'readRecovery', [])).toEqual({ ok: true, value: null });
  });

  it('exports final marks to CSV, one row per student', async () => {
    const path = join(work, 'finals.csv');
    const request = {
      path,
      format: 'csv',
      project: demo,
      columns: [{ field: 'id', header: 'Student ID' }, { field: 'final', header: 'Final %' }],
      include: { breakdown: false, sectionStatistics: false, assessmentStatistics: false },
      overwrite: false,
    };
    const out = value<{ path: string; rows: number }>(await dispatchBridgeCall(handlers, 'exportFinals', [request]));
    expect(out.rows).toBe(demo.gradebook.students.length);
    expect(readFileSync(path, 'utf8')).toContain('Student ID');
  });

  it('passes a service failure through unchanged (a missing file is not-found, not internal)', async () => {
    const result = await dispatchBridgeCall(handlers, 'loadProject', [join(work, 'absent.weighbridge')]);
    expect(result).toMatchObject({ ok: false, code: 'not-found' });
  });

  it('refuses a damaged project payload before it reaches the store', async () => {
    const damaged = { ...demo, plan: { ...demo.plan, rounding: { decimals: -1 } } };
    const result = await dispatchBridgeCall(handlers, 'saveProject', [join(work, 'x.weighbridge'), damaged]);
    expect(result.ok).toBe(false);
    expect(result.ok ? '' : result.message).toContain('project.plan.rounding.decimals');
  });
});
