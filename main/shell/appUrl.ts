/**
 * The app's own origin. The UI is served from a custom scheme rather than file:// so that the
 * page has a real origin (CSP 'self' means something, and no other local file shares it) and so
 * that each request passes through our handler (Electron docs, "Security" tutorial: "Use a custom
 * protocol instead of file://").
 */
export const APP_SCHEME = 'app';
export const APP_HOST = 'weighbridge';
export const APP_ORIGIN = `${APP_SCHEME}://${APP_HOST}`;
export const APP_INDEX_URL = `${APP_ORIGIN}/index.html`;

/** True for app://weighbridge/… and nothing else (no user info, no port). */
export function isAppUrl(url: string): boolean {
  let parsed: URL;
  try {
    parsed = new URL(url);
  } catch {
    return false;
  }
  // Node and Chromium give non-special schemes an opaque origin ('null'), so compare the parts.
  return parsed.protocol === `${APP_SCHEME}:` && parsed.host === APP_HOST && parsed.username === '' && parsed.password === '';
}
