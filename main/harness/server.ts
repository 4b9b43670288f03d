/**
 * The browser harness: serves the built renderer on 127.0.0.1 and implements the DesktopBridge
 * over a loopback connection to the same `main/services` the desktop app uses, through the same
 * `dispatchBridgeCall` (same validation, same handlers). Only the transport differs.
 *
 * Security, because anything on this machine can reach a loopback port:
 * - bound to 127.0.0.1 only, on a random port unless told otherwise;
 * - every RPC needs a random 256-bit token in a header (compared in constant time); the page
 *   receives it in the URL fragment, which browsers never send to the server;
 * - the Host header must be this server's own (defeats DNS rebinding), and a cross-origin Origin
 *   header is refused;
 * - pages and assets carry the same CSP and headers as in Electron; the bridge is a script file
 *   (/harness-bridge.js), never inline, so the CSP needs no exception.
 *
 * Run directly (`npx tsx main/harness/server.ts [--port N] [--user-data DIR]`) it prints the URL.
 */
import { randomBytes, timingSafeEqual } from 'node:crypto';
import { createReadStream, existsSync } from 'node:fs';
import { mkdtemp, readFile, stat } from 'node:fs/promises';
import { createServer, type IncomingMessage, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { extname, join, resolve, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import { bridgeMethods, createBridgeHandlers, dispatchBridgeCall } from '../ipc/index';
import { securityHeaders } from '../ipc/contentSecurity';
import { BUNDLED_WORKER_NAME, defaultWorkerEntry, type WorkerEntry } from '../services/untrusted';

export const TOKEN_HEADER = 'x-weighbridge-token';
/**
 * Content type of a call whose last argument is a long text: the other arguments as a JSON array,
 * a newline (JSON text has none outside strings, where it is escaped), then the text as it is.
 */
export const RAW_TEXT_TYPE = 'application/x-weighbridge-args';
/** From this length on the page sends a last text argument raw. */
const RAW_TEXT_MIN_CHARS = 1 << 20;
/** Largest accepted RPC body: a 10 000-student course as JSON is a few MB. */
const MAX_BODY_BYTES = 64 * 1024 * 1024;

const contentTypes: Readonly<Record<string, string>> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.map': 'application/json; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.ico': 'image/x-icon',
  '.woff2': 'font/woff2',
  '.woff': 'font/woff',
  '.txt': 'text/plain; charset=utf-8',
};

/**
 * The page side of the bridge, served as /harness-bridge.js and run before the app's module
 * script. It reads the token from the fragment, removes it from the address bar (so it is not
 * left in history or copied with the URL), and defines `window.weighbridge`.
 */
export const harnessBridgeScript = `'use strict';
(function () {
  var match = /(?:^#|&)token=([0-9a-f]{64})(?:&|$)/.exec(location.hash);
  var token = match ? match[1] : sessionStorage.getItem('weighbridge-harness-token');
  if (match) {
    // Kept for this tab only, so a reload still works after the fragment is removed.
    sessionStorage.setItem('weighbridge-harness-token', match[1]);
    history.replaceState(null, '', location.pathname + location.search);
  }
  if (!token) return;
  function call(method) {
    return function () {
      var args = Array.prototype.slice.call(arguments);
      // JSON has no undefined: drop trailing ones so optional arguments stay absent.
      while (args.length > 0 && args[args.length - 1] === undefined) args.pop();
      // A long text as the last argument (the recovery copy's JSON) goes after the others as it
      // is: escaping tens of megabytes into a JSON body would be one long task on the page.
      var last = args[args.length - 1];
      var raw = typeof last === 'string' && last.length > ${RAW_TEXT_MIN_CHARS};
      return fetch('./rpc/' + method, {
        method: 'POST',
        headers: { 'content-type': raw ? '${RAW_TEXT_TYPE}' : 'application/json', '${TOKEN_HEADER}': token },
        body: raw ? new Blob([JSON.stringify(args.slice(0, -1)), '\\n', last]) : JSON.stringify(args),
        credentials: 'omit',
        cache: 'no-store'
      }).then(function (response) {
        return response.json();
      }).catch(function (error) {
        return { ok: false, code: 'io', message: 'The harness server did not answer (' + String(error && error.message || error) + '). Is it still running?' };
      });
    };
  }
  var methods = METHODS;
  var bridge = { hasNativeDialogs: false };
  methods.forEach(function (m) { bridge[m] = call(m); });
  Object.defineProperty(window, 'weighbridge', { value: Object.freeze(bridge), writable: false, configurable: false });
})();
`;

export interface HarnessOptions {
  /** 0 or absent: a free port chosen by the OS. */
  readonly port?: number;
  /** Recovery copy and recent files go here; a new temp dir when absent. */
  readonly userDataDir?: string;
  /** The built renderer; default dist/renderer beside this repo. */
  readonly rendererDir?: string;
  /**
   * The spreadsheet-parsing worker. Default: the bundled one the desktop app ships
   * (dist/main/importWorker.mjs, from `npm run build:main`) when it has been built, else the
   * source worker run through tsx (same code, slower to start).
   */
  readonly importWorker?: WorkerEntry;
}

/** See HarnessOptions.importWorker. */
function harnessImportWorker(): WorkerEntry {
  const built = join(repoRoot(), 'dist', 'main', BUNDLED_WORKER_NAME);
  return existsSync(built) ? { kind: 'file', path: built } : defaultWorkerEntry();
}

export interface Harness {
  /** The page to open, with the token in the fragment. */
  readonly url: string;
  readonly token: string;
  readonly userDataDir: string;
  close(): Promise<void>;
}

function repoRoot(): string {
  // main/harness/server.ts when run by tsx; dist/main/harness.mjs when bundled: both two levels down.
  return resolve(fileURLToPath(new URL('.', import.meta.url)), '..', '..');
}

function tokenMatches(expected: Buffer, given: string | string[] | undefined): boolean {
  if (typeof given !== 'string') return false;
  const g = Buffer.from(given, 'utf8');
  return g.length === expected.length && timingSafeEqual(g, expected);
}

function send(res: ServerResponse, status: number, body: string, type = 'text/plain; charset=utf-8'): void {
  res.writeHead(status, { ...securityHeaders, 'Content-Type': type, 'Cache-Control': 'no-store' });
  res.end(body);
}

function readBody(req: IncomingMessage): Promise<string | null> {
  return new Promise((resolveBody, reject) => {
    const chunks: Buffer[] = [];
    let size = 0;
    req.on('data', (chunk: Buffer) => {
      size += chunk.length;
      if (size > MAX_BODY_BYTES) {
        resolveBody(null);
        req.destroy();
        return;
      }
      chunks.push(chunk);
    });
    req.on('end', () => resolveBody(Buffer.concat(chunks).toString('utf8')));
    req.on('error', reject);
  });
}

export async function startHarness(opts: HarnessOptions = {}): Promise<Harness> {
  const rendererDir = resolve(opts.rendererDir ?? join(repoRoot(), 'dist', 'renderer'));
  const indexPath = join(rendererDir, 'index.html');
  const indexStat = await stat(indexPath).catch(() => null);
  if (indexStat === null) {
    throw new Error(`The harness found no built renderer at ${indexPath}. Run "npm run build:renderer" first.`);
  }
  const userDataDir = opts.userDataDir ?? (await mkdtemp(join(tmpdir(), 'weighbridge-harness-')));
  // Spreadsheets are parsed in the same worker, with the same size, time and heap limits, as in
  // the desktop app (main/shell/index.ts), so a file that hangs a parser is stopped here too.
  const handlers = createBridgeHandlers({
    userDataDir,
    dialogs: null,
    appRoot: repoRoot(),
    isolateImports: true,
    importWorker: opts.importWorker ?? harnessImportWorker(),
  });
  const token = randomBytes(32).toString('hex');
  const tokenBytes = Buffer.from(token, 'utf8');
  const bridgeScript = harnessBridgeScript.replace('METHODS', JSON.stringify(bridgeMethods));
  // The page must load the bridge before the app's module script (module scripts are deferred,
  // a classic script in <head> runs first).
  const indexHtml = (await readFile(indexPath, 'utf8')).replace('<head>', '<head>\n    <script src="./harness-bridge.js"></script>');

  let host = '';
  const server = createServer((req, res) => {
    void handle(req, res).catch((error: unknown) => {
      if (!res.headersSent) send(res, 500, `Harness error: ${error instanceof Error ? error.message : String(error)}`);
      else res.destroy();
    });
  });

  async function handle(req: IncomingMessage, res: ServerResponse): Promise<void> {
    if (req.headers.host !== host) return send(res, 421, 'Wrong host.');
    const origin = req.headers.origin;
    if (origin !== undefined && origin !== `http://${host}`) return send(res, 403, 'Cross-origin request refused.');
    const url = new URL(req.url ?? '/', `http://${host}`);

    if (url.pathname.startsWith('/rpc/')) {
      if (req.method !== 'POST') return send(res, 405, 'Use POST.');
      if (!tokenMatches(tokenBytes, req.headers[TOKEN_HEADER])) return send(res, 401, 'Missing or wrong harness token.');
      const type = req.headers['content-type'] ?? '';
      const rawText = type.startsWith(RAW_TEXT_TYPE);
      if (!type.startsWith('application/json') && !rawText) return send(res, 415, 'Send JSON.');
      const body = await readBody(req);
      if (body === null) return send(res, 413, 'Request too large.');
      let args: unknown;
      try {
        if (rawText) {
          const cut = body.indexOf('\n');
          if (cut < 0) throw new Error('no newline');
          const head: unknown = JSON.parse(body.slice(0, cut));
          args = Array.isArray(head) ? [...(head as unknown[]), body.slice(cut + 1)] : head; // a non-array is refused by dispatch
        } else {
          args = JSON.parse(body);
        }
      } catch {
        return send(res, 400, JSON.stringify({ ok: false, code: 'bad-payload', message: 'The request body is not JSON.' }), contentTypes['.json']);
      }
      const method = decodeURIComponent(url.pathname.slice('/rpc/'.length));
      const result = await dispatchBridgeCall(handlers, method, args);
      return send(res, 200, JSON.stringify(result), contentTypes['.json']);
    }

    if (req.method !== 'GET' && req.method !== 'HEAD') return send(res, 405, 'Method not allowed.');
    if (url.pathname === '/harness-bridge.js') return send(res, 200, bridgeScript, contentTypes['.js']);
    if (url.pathname === '/' || url.pathname === '/index.html') return send(res, 200, indexHtml, contentTypes['.html']);

    // Static files inside rendererDir only.
    const filePath = resolve(rendererDir, '.' + decodeURIComponent(url.pathname));
    if (!filePath.startsWith(rendererDir + sep)) return send(res, 403, 'Outside the renderer folder.');
    const info = await stat(filePath).catch(() => null);
    if (info === null || !info.isFile()) return send(res, 404, 'Not found.');
    res.writeHead(200, {
      ...securityHeaders,
      'Content-Type': contentTypes[extname(filePath).toLowerCase()] ?? 'application/octet-stream',
      'Content-Length': String(info.size),
      'Cache-Control': 'no-store',
    });
    if (req.method === 'HEAD') {
      res.end();
      return;
    }
    createReadStream(filePath).pipe(res);
  }

  await new Promise<void>((resolveListen, reject) => {
    server.once('error', reject);
    server.listen(opts.port ?? 0, '127.0.0.1', () => resolveListen());
  });
  const { port } = server.address() as AddressInfo;
  host = `127.0.0.1:${port}`;

  return {
    url: `http://${host}/#token=${token}`,
    token,
    userDataDir,
    close: () =>
      new Promise<void>((resolveClose, reject) => {
        server.closeAllConnections();
        server.close((error) => (error ? reject(error) : resolveClose()));
      }),
  };
}

function argValue(args: readonly string[], name: string): string | undefined {
  const i = args.indexOf(name);
  return i >= 0 ? args[i + 1] : undefined;
}

const invokedDirectly = process.argv[1] !== undefined && resolve(process.argv[1]) === fileURLToPath(import.meta.url);
if (invokedDirectly) {
  const args = process.argv.slice(2);
  const portText = argValue(args, '--port');
  const port = portText === undefined ? 0 : Number(portText);
  if (!Number.isInteger(port) || port < 0 || port > 65535) {
    console.error(`--port ${portText}: give a whole number from 0 to 65535.`);
    process.exit(2);
  }
  const userDataDir = argValue(args, '--user-data');
  startHarness({ port, userDataDir }).then(
    (h) => {
      console.log(`Weighbridge harness (user data in ${h.userDataDir})`);
      console.log(`Open: ${h.url}`);
      console.log('Press Ctrl+C to stop.');
    },
    (error: unknown) => {
      console.error(error instanceof Error ? error.message : String(error));
      process.exit(1);
    },
  );
}
