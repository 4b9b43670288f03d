/**
 * The export request names the open project file (`projectPath`), and a call through the IPC
 * table onto that file is refused with the file left as it was. Real handlers, real services,
 * temp folders.
 */
import { mkdtempSync, readFileSync, rmSync, symlinkSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CourseProject, ExportRequest, Result } from '../../renderer/bridge/contract';
import { createBridgeHandlers, dispatchBridgeCall, type BridgeHandlers } from '../../main/ipc/index';

const root = resolve(import.meta.dirname, '../..');

let work = '';
let handlers: BridgeHandlers;
let demo: CourseProject;
let projectPath = '';

function value<T>(result: Result<unknown>): T {
  if (!result.ok) throw new Error(`${result.code}: ${result.message}`);
  return result.value as T;
}

function request(path: string, extra: Partial<ExportRequest> = {}): ExportRequest {
  return {
    path,
    format: 'csv',
    project: demo,
    columns: [{ field: 'id', header: 'Student ID' }, { field: 'final', header: 'Final %' }],
    include: { breakdown: false, sectionStatistics: false, assessmentStatistics: false },
    overwrite: true,
    ...extra,
  };
}

beforeAll(async () => {
  work = mkdtempSync(join(tmpdir(), 'wb-ipc-export-'));
  handlers = createBridgeHandlers({ userDataDir: join(work, 'userData'), dialogs: null, appRoot: root });
  demo = value<CourseProject>(await dispatchBridgeCall(handlers, 'demoCourse', []));
  projectPath = join(work, 'course.csv');
  value(await dispatchBridgeCall(handlers, 'saveProject', [projectPath, demo]));
});

afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('exportFinals through the bridge knows the open project file', () => {
  it('refuses to export onto the open project file, even with overwrite confirmed', async () => {
    const before = readFileSync(projectPath);
    const r = await dispatchBridgeCall(handlers, 'exportFinals', [request(projectPath, { projectPath })]);
    expect(r).toMatchObject({ ok: false, code: 'bad-input' });
    expect(r.ok ? '' : r.message).toContain('is the open project file');
    expect(readFileSync(projectPath)).toEqual(before);
  });

  it('recognises the project file under another name (a link to it) only because the request names it', async () => {
    const alias = join(work, 'alias.csv');
    symlinkSync(projectPath, alias);
    const before = readFileSync(projectPath);
    const named = await dispatchBridgeCall(handlers, 'exportFinals', [request(alias, { projectPath })]);
    expect(named.ok ? '' : named.message).toContain('is the open project file');
    // Without projectPath only the content check is left, which words its refusal differently:
    // so the first refusal came from the path the request carried through the table.
    const unnamed = await dispatchBridgeCall(handlers, 'exportFinals', [request(alias)]);
    expect(unnamed.ok ? '' : unnamed.message).toContain('is a Weighbridge project or plan file');
    expect(readFileSync(projectPath)).toEqual(before);
  });

  it('exports beside the project when the target is another file', async () => {
    const path = join(work, 'finals.csv');
    const out = value<{ path: string; rows: number }>(await dispatchBridgeCall(handlers, 'exportFinals', [request(path, { projectPath })]));
    expect(out).toEqual({ path, rows: demo.gradebook.students.length });
  });

  it('accepts null for a course never saved, and refuses a relative project path before any service runs', async () => {
    const path = join(work, 'unsaved.csv');
    expect((await dispatchBridgeCall(handlers, 'exportFinals', [request(path, { projectPath: null })])).ok).toBe(true);
    const relative = await dispatchBridgeCall(handlers, 'exportFinals', [request(join(work, 'rel.csv'), { projectPath: 'course.csv' })]);
    expect(relative).toMatchObject({ ok: false, code: 'bad-payload' });
    expect(relative.ok ? '' : relative.message).toContain('request.projectPath');
  });
});
