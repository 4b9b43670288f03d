/**
 * The Content-Security-Policy (Electron security checklist #7; directive meanings per the W3C
 * "Content Security Policy Level 3" spec and MDN's CSP reference).
 */
import { describe, expect, it } from 'vitest';
import { contentSecurityPolicy, cspDirectives, securityHeaders } from '../../main/shell/csp';
import { item } from './checklist';

/** Parse "a x y; b z" into { a: ['x','y'], b: ['z'] } — the header's own grammar. */
function parse(policy: string): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const part of policy.split(';')) {
    const [name, ...sources] = part.trim().split(/\s+/);
    if (name) out[name] = sources;
  }
  return out;
}

describe('content security policy', () => {
  const policy = parse(contentSecurityPolicy);

  it(item(7, 'everything defaults to the app origin only'), () => {
    expect(policy['default-src']).toEqual(["'self'"]);
  });

  it(item(7, "scripts only from the app: no 'unsafe-inline', no 'unsafe-eval', no other host"), () => {
    expect(policy['script-src']).toEqual(["'self'"]);
  });

  it(item(7, "styles only from files: no 'unsafe-inline'"), () => {
    expect(policy['style-src']).toEqual(["'self'"]);
  });

  it(item(7, 'images from the app or data: URLs; network requests only to the app itself'), () => {
    expect(policy['img-src']).toEqual(["'self'", 'data:']);
    expect(policy['connect-src']).toEqual(["'self'"]);
  });

  it(item(7, 'no plugins, no <base> rewriting, no framing by others, no form posts'), () => {
    expect(policy['object-src']).toEqual(["'none'"]);
    expect(policy['base-uri']).toEqual(["'none'"]);
    expect(policy['frame-ancestors']).toEqual(["'none'"]);
    expect(policy['form-action']).toEqual(["'none'"]);
  });

  it('names no unsafe keyword and no wildcard anywhere', () => {
    expect(contentSecurityPolicy).not.toMatch(/unsafe-|\*|https?:|blob:|filesystem:/);
  });

  it('is the header sent, with nosniff beside it, and matches the directive table', () => {
    expect(securityHeaders['Content-Security-Policy']).toBe(contentSecurityPolicy);
    expect(securityHeaders['X-Content-Type-Options']).toBe('nosniff');
    expect(Object.keys(policy).sort()).toEqual(Object.keys(cspDirectives).sort());
  });
});
