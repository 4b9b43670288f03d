// The loopback harness's own guards, over plain HTTP from Node (no browser): 127.0.0.1 only, the
// token on every call, same-origin only, files only from the renderer folder, the app's CSP on
// every response. Expected values are the harness's documented contract (main/harness/server.ts)
// and the policy text in main/ipc/contentSecurity.ts.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { request } from 'node:http';
import { existsSync } from 'node:fs';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { RAW_TEXT_TYPE, startHarness, TOKEN_HEADER, type Harness } from '../../main/harness/server';
import { contentSecurityPolicy } from '../../main/ipc/contentSecurity';
import { previewSpreadsheet } from '../../main/services/spreadsheet';
import { repoRoot } from './harness';

interface Reply {
  status: number;
  headers: Record<string, string | string[] | undefined>;
  body: string;
}

/** `path` goes on the wire verbatim (no URL normalisation), so traversal attempts really reach the server. */
function send(base: URL, path: string, opts: { method?: string; headers?: Record<string, string>; body?: string }): Promise<Reply> {
  return new Promise((resolve, reject) => {
    const req = request({ host: base.hostname, port: base.port, path, method: opts.method ?? 'GET', headers: opts.headers }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks).toString('utf8') }));
    });
    req.on('error', reject);
    if (opts.body !== undefined) req.write(opts.body);
    req.end();
  });
}

const hasBuild = existsSync(join(repoRoot, 'dist', 'renderer', 'index.html'));

describe('browser harness server', () => {
  let harness: Harness;
  let base: URL;
  let userDataDir: string;

  beforeAll(async () => {
    if (!hasBuild) throw new Error('dist/renderer is missing: run "npm run build:renderer" before the browser tests.');
    userDataDir = await mkdtemp(join(tmpdir(), 'weighbridge-harness-test-'));
    harness = await startHarness({ userDataDir });
    base = new URL(harness.url);
  });
  afterAll(async () => {
    await harness?.close();
    await rm(userDataDir, { recursive: true, force: true });
  });

  const rpc = (method: string, args: unknown, headers: Record<string, string> = {}) =>
    send(base, `/rpc/${method}`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', [TOKEN_HEADER]: harness.token, ...headers },
      body: JSON.stringify(args),
    });

  it('listens on 127.0.0.1 with a 256-bit hex token in the URL fragment only', () => {
    expect(base.hostname).toBe('127.0.0.1');
    expect(harness.token).toMatch(/^[0-9a-f]{64}$/);
    expect(base.hash).toBe(`#token=${harness.token}`);
    expect(base.search).toBe('');
  });

  it('answers a call with the token through the real services', async () => {
    const reply = await rpc('recentFiles', []);
    expect(reply.status).toBe(200);
    expect(JSON.parse(reply.body)).toEqual({ ok: true, value: [] });
  });

  it('refuses a call without the token, or with a wrong one of the same length', async () => {
    const none = await send(base, '/rpc/recentFiles', { method: 'POST', headers: { 'content-type': 'application/json' }, body: '[]' });
    expect(none.status).toBe(401);
    const wrong = await rpc('recentFiles', [], { [TOKEN_HEADER]: 'f'.repeat(64) === harness.token ? '0'.repeat(64) : 'f'.repeat(64) });
    expect(wrong.status).toBe(401);
  });

  it('refuses another Host (DNS rebinding) and a cross-origin Origin', async () => {
    const host = await rpc('recentFiles', [], { host: `evil.example:${base.port}` });
    expect(host.status).toBe(421);
    const origin = await rpc('recentFiles', [], { origin: 'http://evil.example' });
    expect(origin.status).toBe(403);
  });

  it('passes unknown methods and bad arguments to the shared validator, which refuses them', async () => {
    const unknown = JSON.parse((await rpc('deleteEverything', [])).body) as { ok: boolean; code: string };
    expect(unknown).toMatchObject({ ok: false, code: 'unknown-method' });
    const bad = JSON.parse((await rpc('loadProject', ['relative/path.weighbridge'])).body) as { ok: boolean; code: string };
    expect(bad).toMatchObject({ ok: false, code: 'bad-payload' });
    const notJson = await send(base, '/rpc/recentFiles', { method: 'POST', headers: { 'content-type': 'application/json', [TOKEN_HEADER]: harness.token }, body: '{' });
    expect(notJson.status).toBe(400);
  });

  it('takes a long last text raw after the other arguments, and refuses such a body without its newline', async () => {
    const headers = { 'content-type': RAW_TEXT_TYPE, [TOKEN_HEADER]: harness.token };
    const demo = JSON.parse((await rpc('demoCourse', [])).body) as { ok: true; value: unknown };
    const text = JSON.stringify(demo.value);
    const ok = await send(base, '/rpc/writeRecovery', { method: 'POST', headers, body: `[null]\n${text}` });
    expect(JSON.parse(ok.body)).toMatchObject({ ok: true });
    const back = JSON.parse((await rpc('readRecovery', [])).body) as { ok: true; value: { project: unknown } };
    expect(back.value.project).toEqual(demo.value);
    const cut = await send(base, '/rpc/writeRecovery', { method: 'POST', headers, body: '[null]' });
    expect(cut.status).toBe(400);
    const notArray = JSON.parse((await send(base, '/rpc/writeRecovery', { method: 'POST', headers, body: `{"a":1}\n${text}` })).body) as { ok: boolean; code: string };
    expect(notArray).toMatchObject({ ok: false, code: 'bad-payload' });
  });

  it('reports that there are no native dialogs, so the page asks for a path', async () => {
    const r = JSON.parse((await rpc('chooseOpenPath', ['spreadsheet'])).body) as { ok: boolean; code: string };
    expect(r).toMatchObject({ ok: false, code: 'no-dialogs' });
  });

  it('serves the page with the app CSP and the bridge as a script file, never inline', async () => {
    const page = await send(base, '/', {});
    expect(page.status).toBe(200);
    expect(page.headers['content-security-policy']).toBe(contentSecurityPolicy);
    expect(page.headers['x-content-type-options']).toBe('nosniff');
    // Every <script> has a src: nothing the CSP would have to allow inline.
    const scripts = [...page.body.matchAll(/<script\b([^>]*)>([\s\S]*?)<\/script>/g)];
    expect(scripts.length).toBeGreaterThanOrEqual(2);
    for (const [, attrs, content] of scripts) {
      expect(attrs).toMatch(/\bsrc=/);
      expect(content?.trim()).toBe('');
    }
    expect(page.body).not.toMatch(/\sstyle=/);
    const bridge = await send(base, '/harness-bridge.js', {});
    expect(bridge.status).toBe(200);
    expect(bridge.headers['content-type']).toMatch(/^text\/javascript/);
    expect(bridge.headers['content-security-policy']).toBe(contentSecurityPolicy);
    expect(bridge.body).not.toContain(harness.token);
  });

  it('serves nothing outside the renderer folder', async () => {
    const traversal = await send(base, '/../../package.json', {});
    // The URL parser folds plain "..": what is left is a file that is not in dist/renderer.
    expect(traversal.status).toBe(404);
    expect(traversal.body).not.toContain('"devDependencies"');
    // An encoded slash survives URL parsing and decodes to "../..": refused by the folder check.
    const encoded = await send(base, '/..%2f..%2fpackage.json', {});
    expect(encoded.status).toBe(403);
    expect(encoded.body).not.toContain('"devDependencies"');
    const missing = await send(base, '/nope.js', {});
    expect(missing.status).toBe(404);
  });
});

describe('browser harness spreadsheet reading', () => {
  // The harness parses spreadsheets in the desktop app's worker (main/services/untrusted), so its
  // time limit stops a parse that never ends. A stand-in worker that announces itself ready and then
  // spins on every job plays a parser caught in an endless loop.
  const spinningWorker = {
    kind: 'eval' as const,
    code: "const { parentPort } = require('node:worker_threads'); parentPort.postMessage({ type: 'ready' }); parentPort.on('message', () => { for (;;) {} });",
  };

  const demoCsv = join(repoRoot, 'demo-data', 'glaciology-231.csv');

  /** previewSpreadsheet(demoCsv, override) through a fresh harness; its parsed reply. */
  async function previewThroughHarness(options: Parameters<typeof startHarness>[0], override: object): Promise<unknown> {
    const userDataDir = await mkdtemp(join(tmpdir(), 'weighbridge-harness-test-'));
    const harness = await startHarness({ ...options, userDataDir });
    try {
      const reply = await send(new URL(harness.url), '/rpc/previewSpreadsheet', {
        method: 'POST',
        headers: { 'content-type': 'application/json', [TOKEN_HEADER]: harness.token },
        body: JSON.stringify([demoCsv, override]),
      });
      return JSON.parse(reply.body);
    } finally {
      await harness.close();
      await rm(userDataDir, { recursive: true, force: true });
    }
  }

  it('stops a parse that never ends at the time limit, in the limit message’s words', async () => {
    const result = (await previewThroughHarness({ importWorker: spinningWorker }, { limits: { maxSeconds: 1 } })) as { ok: boolean; message?: string };
    expect(result).toMatchObject({ ok: false, code: 'timeout' });
    expect(result.message).toContain('Reading "glaciology-231.csv" took longer than 1 s and was stopped.');
  });

  it('reads through the same worker by default and gets the service’s answer', async () => {
    const direct = await previewSpreadsheet(demoCsv);
    expect(await previewThroughHarness({}, {})).toEqual(JSON.parse(JSON.stringify(direct)));
  });
});
