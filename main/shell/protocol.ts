/**
 * Serving the built renderer (dist/renderer) on app://weighbridge/…. Kept free of 'electron' so
 * it runs in tests: `serveAppRequest` takes a fetch `Request` and returns a fetch `Response`, which
 * is exactly what Electron's `protocol.handle` passes and expects.
 *
 * Refused: other schemes and hosts, any path that leaves the renderer folder (`..`, encoded
 * `%2e%2e%2f`, backslashes, absolute and drive paths, NUL), symlinks pointing outside, folders.
 */
import { readFile, realpath, stat } from 'node:fs/promises';
import { extname, isAbsolute, posix, relative, resolve } from 'node:path';
import { securityHeaders } from '../ipc/contentSecurity';
import { isAppUrl } from './appUrl';

/** Content types of what a Vite build emits. Unknown types are served as opaque bytes (with nosniff). */
export const mimeTypes: Readonly<Record<string, string>> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.map': 'application/json; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.jpg': 'image/jpeg',
  '.jpeg': 'image/jpeg',
  '.gif': 'image/gif',
  '.webp': 'image/webp',
  '.ico': 'image/x-icon',
  '.woff': 'font/woff',
  '.woff2': 'font/woff2',
  '.ttf': 'font/ttf',
  '.txt': 'text/plain; charset=utf-8',
  '.wasm': 'application/wasm',
};

export function mimeTypeFor(filePath: string): string {
  return mimeTypes[extname(filePath).toLowerCase()] ?? 'application/octet-stream';
}

export type ResolvedRequest =
  | { readonly ok: true; readonly filePath: string; readonly mimeType: string }
  | { readonly ok: false; readonly status: 400 | 403 | 404; readonly reason: string };

const refuse = (status: 400 | 403 | 404, reason: string): ResolvedRequest => ({ ok: false, status, reason });

/** True when `child` is `root` itself or inside it (after both are resolved). */
export function isInside(root: string, child: string): boolean {
  const rel = relative(root, child);
  return rel === '' || (!rel.startsWith('..') && !isAbsolute(rel));
}

/**
 * Map an app:// URL to a file under `rootDir` without touching the disk. The URL parser already
 * removes literal dot segments; what it leaves encoded (`%2e`, `%2f`, `%5c`) is decoded here and
 * the result checked again, so no spelling of ".." gets out.
 */
export function resolveAppPath(url: string, rootDir: string): ResolvedRequest {
  let parsed: URL;
  try {
    parsed = new URL(url);
  } catch {
    return refuse(400, 'not a URL');
  }
  if (!isAppUrl(url)) return refuse(403, 'not the app origin');
  let decoded: string;
  try {
    decoded = decodeURIComponent(parsed.pathname);
  } catch {
    return refuse(400, 'malformed percent-encoding');
  }
  if (decoded.includes('\0')) return refuse(400, 'NUL in path');
  // A backslash or drive letter would be a separator or a root on Windows.
  if (decoded.includes('\\') || /^\/?[A-Za-z]:/.test(decoded)) return refuse(403, 'Windows path syntax');
  const segments = decoded.split('/');
  if (segments.some((s) => s === '..')) return refuse(403, 'path leaves the app folder');
  const normal = posix.normalize(decoded === '' || decoded === '/' ? '/index.html' : decoded);
  const root = resolve(rootDir);
  const filePath = resolve(root, '.' + normal);
  if (!isInside(root, filePath) || filePath === root) return refuse(403, 'path leaves the app folder');
  return { ok: true, filePath, mimeType: mimeTypeFor(filePath) };
}

function errorResponse(status: number, text: string): Response {
  return new Response(text, { status, headers: { ...securityHeaders, 'Content-Type': 'text/plain; charset=utf-8' } });
}

/**
 * The protocol handler: resolve, follow symlinks and check again (a link inside dist/renderer must
 * not reach outside it), then send the bytes with the type and the security headers.
 */
export async function serveAppRequest(request: Request, rootDir: string): Promise<Response> {
  if (request.method !== 'GET' && request.method !== 'HEAD') return errorResponse(405, 'Method not allowed');
  const resolved = resolveAppPath(request.url, rootDir);
  if (!resolved.ok) return errorResponse(resolved.status, resolved.reason);
  try {
    const [realRoot, realFile] = await Promise.all([realpath(rootDir), realpath(resolved.filePath)]);
    if (!isInside(realRoot, realFile) || realFile === realRoot) return errorResponse(403, 'path leaves the app folder');
    if (!(await stat(realFile)).isFile()) return errorResponse(404, 'Not found');
    const body = request.method === 'HEAD' ? null : await readFile(realFile);
    return new Response(body, { status: 200, headers: { ...securityHeaders, 'Content-Type': resolved.mimeType } });
  } catch {
    return errorResponse(404, 'Not found');
  }
}
