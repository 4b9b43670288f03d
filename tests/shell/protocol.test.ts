/**
 * The app:// handler: path resolution is refused outside dist/renderer however the path is spelt,
 * and files go out with their type and the security headers. Electron security checklist #18
 * (custom protocol instead of file://) and #7 (CSP on every response). Traversal spellings are the
 * classic ones (OWASP "Path Traversal": `../`, percent-encoded `%2e%2e%2f`, backslash variants).
 */
import { mkdirSync, mkdtempSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { contentSecurityPolicy } from '../../main/shell/csp';
import { mimeTypeFor, resolveAppPath, serveAppRequest } from '../../main/shell/protocol';
import { item } from './checklist';

let base = '';
let root = '';

beforeAll(() => {
  base = mkdtempSync(join(tmpdir(), 'wb-protocol-'));
  root = join(base, 'renderer');
  mkdirSync(join(root, 'assets'), { recursive: true });
  writeFileSync(join(root, 'index.html'), '<!doctype html><title>x</title>');
  writeFileSync(join(root, 'assets', 'app-1234.js'), 'console.log(1)');
  writeFileSync(join(root, 'assets', 'app-1234.css'), 'body{}');
  writeFileSync(join(base, 'secret.txt'), 'outside');
  try {
    symlinkSync(join(base, 'secret.txt'), join(root, 'assets', 'link.txt'));
  } catch {
    // Symlinks may need privileges on Windows; the resolution tests still run.
  }
});

afterAll(() => rmSync(base, { recursive: true, force: true }));

describe('resolveAppPath', () => {
  it('maps app://weighbridge/ and /index.html to index.html', () => {
    for (const url of ['app://weighbridge/', 'app://weighbridge', 'app://weighbridge/index.html']) {
      const r = resolveAppPath(url, root);
      expect(r.ok && r.filePath, url).toBe(join(root, 'index.html'));
    }
  });

  it('maps nested assets, ignoring query and hash', () => {
    const r = resolveAppPath('app://weighbridge/assets/app-1234.js?v=1#x', root);
    expect(r).toEqual({ ok: true, filePath: join(root, 'assets', 'app-1234.js'), mimeType: 'text/javascript; charset=utf-8' });
  });

  it(item(18, 'refuses every spelling of a path that leaves the renderer folder'), () => {
    const attempts = [
      'app://weighbridge/..%2fsecret.txt',
      'app://weighbridge/%2e%2e%2fsecret.txt',
      'app://weighbridge/assets/..%2f..%2fsecret.txt',
      'app://weighbridge/..%5csecret.txt',
      'app://weighbridge/assets%5c..%5c..%5csecret.txt',
      'app://weighbridge/%2fetc%2fpasswd/..%2f..%2f..',
      'app://weighbridge/C:%5cWindows%5cwin.ini',
      'app://weighbridge/c:/Windows/win.ini',
      'app://weighbridge/index.html%00.png',
    ];
    for (const url of attempts) {
      const r = resolveAppPath(url, root);
      expect(r.ok, url).toBe(false);
      if (r.ok) continue;
      expect([400, 403], url).toContain(r.status);
    }
  });

  it('keeps literal and %2e dot segments inside (the URL parser removes them before we see the path)', () => {
    // WHATWG URL Standard, path state: ".." and "%2e%2e" (any case) are double-dot segments and are
    // popped at the root, so these arrive as "/secret.txt" — inside the root (and absent there).
    for (const url of ['app://weighbridge/../../secret.txt', 'app://weighbridge/%2e%2e/secret.txt', 'app://weighbridge/assets/%2E%2e/%2e%2E/secret.txt']) {
      const r = resolveAppPath(url, root);
      expect(r.ok && r.filePath, url).toBe(join(root, 'secret.txt'));
    }
  });

  it('treats an encoded absolute path as relative to the root, never as the real absolute path', () => {
    const r = resolveAppPath('app://weighbridge/%2Fetc%2Fpasswd', root);
    expect(r.ok && r.filePath).toBe(join(root, 'etc', 'passwd'));
  });

  it(item(18, 'refuses file://, other schemes and other hosts'), () => {
    for (const url of ['file:///etc/passwd', `file://${join(root, 'index.html')}`, 'https://weighbridge/index.html', 'app://evil/index.html', 'app://weighbridge:80/index.html', 'app://user@weighbridge/index.html', 'not a url']) {
      expect(resolveAppPath(url, root).ok, url).toBe(false);
    }
  });

  it('refuses malformed percent-encoding', () => {
    expect(resolveAppPath('app://weighbridge/%E0%A4%A', root)).toMatchObject({ ok: false, status: 400 });
  });
});

describe('mimeTypeFor', () => {
  it('gives the registered types for what a Vite build emits (IANA media types; RFC 9239 for JavaScript)', () => {
    expect(mimeTypeFor('a/index.html')).toBe('text/html; charset=utf-8');
    expect(mimeTypeFor('a/x.JS')).toBe('text/javascript; charset=utf-8');
    expect(mimeTypeFor('a/x.css')).toBe('text/css; charset=utf-8');
    expect(mimeTypeFor('a/x.svg')).toBe('image/svg+xml');
    expect(mimeTypeFor('a/x.woff2')).toBe('font/woff2');
    expect(mimeTypeFor('a/x.wasm')).toBe('application/wasm');
  });

  it('serves an unknown type as opaque bytes', () => {
    expect(mimeTypeFor('a/x.exe')).toBe('application/octet-stream');
    expect(mimeTypeFor('a/noext')).toBe('application/octet-stream');
  });
});

describe('serveAppRequest', () => {
  it(item(7, 'serves index.html with its type, the CSP and nosniff'), async () => {
    const res = await serveAppRequest(new Request('app://weighbridge/index.html'), root);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('text/html; charset=utf-8');
    expect(res.headers.get('content-security-policy')).toBe(contentSecurityPolicy);
    expect(res.headers.get('x-content-type-options')).toBe('nosniff');
    expect(await res.text()).toBe('<!doctype html><title>x</title>');
  });

  it('serves a CSS asset as CSS', async () => {
    const res = await serveAppRequest(new Request('app://weighbridge/assets/app-1234.css'), root);
    expect(res.headers.get('content-type')).toBe('text/css; charset=utf-8');
    expect(await res.text()).toBe('body{}');
  });

  it('answers 404 for a missing file and for a folder', async () => {
    expect((await serveAppRequest(new Request('app://weighbridge/nope.js'), root)).status).toBe(404);
    expect((await serveAppRequest(new Request('app://weighbridge/assets'), root)).status).toBe(404);
  });

  it('answers 403 for traversal, with the CSP still set', async () => {
    const res = await serveAppRequest(new Request('app://weighbridge/..%2fsecret.txt'), root);
    expect(res.status).toBe(403);
    expect(res.headers.get('content-security-policy')).toBe(contentSecurityPolicy);
    expect(await res.text()).not.toContain('outside');
  });

  it('refuses a symlink inside the folder that points outside it', async () => {
    const res = await serveAppRequest(new Request('app://weighbridge/assets/link.txt'), root);
    expect([403, 404]).toContain(res.status);
    expect(await res.text()).not.toContain('outside');
  });

  it('refuses methods other than GET and HEAD', async () => {
    const res = await serveAppRequest(new Request('app://weighbridge/index.html', { method: 'POST', body: 'x' }), root);
    expect(res.status).toBe(405);
  });
});
