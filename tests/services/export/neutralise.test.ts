/**
 * Source: OWASP, "CSV Injection" (owasp.org/www-community/attacks/CSV_Injection): fields beginning
 * with `=`, `+`, `-`, `@`, tab (0x09), carriage return (0x0D) or line feed (0x0A) must be prefixed
 * with a single quote and quoted; spreadsheet programs also look past leading spaces and quotes.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { needsNeutralising, neutraliseCell, stripNeutraliser } from '../../../main/services/export';

const OWASP_PREFIXES = ['=', '+', '-', '@', '\t', '\r', '\n'];

describe('neutraliseCell (OWASP CSV Injection)', () => {
  it.each(OWASP_PREFIXES.map((p) => [JSON.stringify(p), p]))('prefixes text starting with %s', (_label, prefix) => {
    const text = `${prefix}HYPERLINK("http://example.invalid","x")`;
    expect(neutraliseCell(text)).toBe(`'${text}`);
  });

  it.each(OWASP_PREFIXES.flatMap((p) => ['  ', '"', "'", ' "'].map((lead) => [JSON.stringify(lead + p), lead + p])))(
    'also after leading spaces or quotes: %s',
    (_label, text) => {
      expect(neutraliseCell(`${text}1+1`)).toBe(`'${text}1+1`);
    },
  );

  it('leaves ordinary text alone', () => {
    for (const text of ['Zoë Ångström', 'O\'Brien', 'A-01', 'Smith, Jo', '', ' plain', '"quoted"', '1+1', 'a=b']) {
      expect(neutraliseCell(text)).toBe(text);
    }
  });

  it('stripNeutraliser undoes exactly what neutraliseCell added (property)', () => {
    fc.assert(
      fc.property(fc.string({ unit: fc.constantFrom('=', '+', '-', '@', '\t', '\r', '\n', ' ', '"', "'", 'a', '1', 'é') }), (text) => {
        expect(stripNeutraliser(neutraliseCell(text))).toBe(text);
        expect(needsNeutralising(neutraliseCell(text))).toBe(needsNeutralising(text));
      }),
      { numRuns: 2000 },
    );
  });

  it('keeps a quote the user typed when it was not a neutraliser', () => {
    expect(stripNeutraliser("'tis")).toBe("'tis");
    expect(stripNeutraliser("'=1")).toBe('=1');
  });
});
