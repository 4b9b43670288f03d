/**
 * The Content-Security-Policy every page of the app is served with. It lives beside the IPC table
 * (not in main/shell) so that the browser harness can send the very same header: the renderer is
 * then tested under the policy it will meet in Electron.
 *
 * Everything comes from the app's own origin; no inline script, no eval, no inline <style>, no
 * plugins, no framing, no form posts, no <base> rewriting. `connect-src 'self'` lets the harness
 * page talk to its own loopback server and nothing else.
 */
export const cspDirectives = {
  'default-src': ["'self'"],
  'script-src': ["'self'"],
  'style-src': ["'self'"],
  'img-src': ["'self'", 'data:'],
  'font-src': ["'self'"],
  'connect-src': ["'self'"],
  'object-src': ["'none'"],
  'base-uri': ["'none'"],
  'frame-ancestors': ["'none'"],
  'form-action': ["'none'"],
} as const satisfies Readonly<Record<string, readonly string[]>>;

/** The header value: "default-src 'self'; script-src 'self'; …". */
export const contentSecurityPolicy: string = Object.entries(cspDirectives)
  .map(([name, sources]) => `${name} ${sources.join(' ')}`)
  .join('; ');

/** Headers sent with every app page and asset, whichever server sends it. */
export const securityHeaders: Readonly<Record<string, string>> = {
  'Content-Security-Policy': contentSecurityPolicy,
  'X-Content-Type-Options': 'nosniff',
  'Cross-Origin-Opener-Policy': 'same-origin',
  'Referrer-Policy': 'no-referrer',
};
