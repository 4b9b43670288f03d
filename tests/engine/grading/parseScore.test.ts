import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { DEFAULT_TOKENS, formatScore, parseScore, type ScoreTokens } from '../../../renderer/engine/grading/parseScore';

// Number forms follow ISO 80000-1:2009 §7.3.1 (comma or point as decimal sign, thin-space grouping)
// and spreadsheet practice (point/comma/apostrophe thousands) — common practice.

const points = (cell: string | number | null | undefined, possible = 20, tokens: ScoreTokens = DEFAULT_TOKENS): number => {
  const r = parseScore(cell, possible, tokens);
  if (!r.ok) throw new Error(`expected a score for ${String(cell)}: ${r.message}`);
  if (r.score.kind !== 'earned') throw new Error(`expected points for ${String(cell)}, got ${r.score.kind}`);
  return r.score.points;
};
const kind = (cell: string | null | undefined, tokens: ScoreTokens = DEFAULT_TOKENS): string => {
  const r = parseScore(cell, 20, tokens);
  if (!r.ok) throw new Error(r.message);
  return r.score.kind;
};
const message = (cell: string | number, possible = 20): string => {
  const r = parseScore(cell, possible, DEFAULT_TOKENS);
  if (r.ok) throw new Error(`expected an error for ${String(cell)}`);
  return r.message;
};

describe('parseScore: accepted forms', () => {
  it('plain numbers, as numbers and as text', () => {
    expect(points(17)).toBe(17);
    expect(points(0)).toBe(0);
    expect(Object.is(points(-0), 0)).toBe(true);
    expect(points('17')).toBe(17);
    expect(points('  17  ')).toBe(17);
    expect(points('7.5')).toBe(7.5);
    expect(points('.5')).toBe(0.5);
    expect(points('25')).toBe(25); // above possible is the importer's warning, not a parse error
  });

  it('decimal comma', () => {
    expect(points('7,5')).toBe(7.5);
    expect(points(',5')).toBe(0.5);
    expect(points('0,125')).toBe(0.125); // leading 0 cannot be a thousands group
    expect(points('12,25')).toBe(12.25);
  });

  it('grouped thousands where unambiguous', () => {
    expect(points('1 234,5')).toBe(1234.5);
    expect(points('1\u00a0234,5')).toBe(1234.5); // no-break space
    expect(points('1\u202f234,5')).toBe(1234.5); // narrow no-break space (ISO 80000 style)
    expect(points('1.234,5')).toBe(1234.5);
    expect(points('1,234.5')).toBe(1234.5);
    expect(points("1'234.5")).toBe(1234.5);
    expect(points('1.234.567')).toBe(1234567);
    expect(points('1,234,567')).toBe(1234567);
    expect(points('1 234')).toBe(1234);
    expect(points('1.234')).toBe(1.234); // a lone point is always the decimal point
  });

  it('fractions scale to the points possible: a/b × possible', () => {
    expect(points('18/20', 20)).toBe(18);
    expect(points('18/20', 10)).toBe(9);
    expect(points('18 / 20', 10)).toBe(9);
    expect(points('7,5/10', 20)).toBe(15);
    expect(points('1/3', 3)).toBe(1);
  });

  it('percents scale to the points possible: p/100 × possible', () => {
    expect(points('85%', 20)).toBe(17);
    expect(points('85 %', 20)).toBe(17);
    expect(points('12,5%', 8)).toBe(1);
    expect(points('110%', 10)).toBe(11);
  });

  it('state tokens, trimmed and case-insensitive; blank is missing', () => {
    expect(kind('EX')).toBe('excused');
    expect(kind(' ex ')).toBe('excused');
    expect(kind('Excused')).toBe('excused');
    expect(kind('exc')).toBe('excused');
    expect(kind('')).toBe('missing');
    expect(kind('   ')).toBe('missing');
    expect(kind(null)).toBe('missing');
    expect(kind(undefined)).toBe('missing');
    expect(kind('-')).toBe('missing');
    expect(kind('—')).toBe('missing');
    expect(kind('missing')).toBe('missing');
    expect(kind('m')).toBe('missing');
    expect(kind('pending')).toBe('pending');
    expect(kind('tbd')).toBe('pending');
  });

  it('custom tokens replace the defaults; blank follows the list that holds the empty token', () => {
    const tokens: ScoreTokens = { excused: ['  Entschuldigt '], missing: ['fehlt'], pending: ['', 'offen'] };
    expect(kind('entschuldigt', tokens)).toBe('excused');
    expect(kind('FEHLT', tokens)).toBe('missing');
    expect(kind('', tokens)).toBe('pending');
    expect(kind('offen', tokens)).toBe('pending');
    expect(parseScore('EX', 20, tokens).ok).toBe(false);
    // no list holds the empty token → blank is missing
    expect(kind('', { excused: [], missing: [], pending: [] })).toBe('missing');
  });
});

describe('parseScore: rejected forms, each with what was seen and what is accepted', () => {
  const accepted = 'use a number of points (17, 7.5 or 7,5), a fraction (18/20), a percent (85%)';
  it.each([
    ['-5', 'is negative'],
    ['−5', 'is negative'],
    ['-5%', 'is negative'],
    ['abc', 'is not a score'],
    ['P', 'is not a score'], // P means "pass" in many books: deliberately not a token
    ['1e2', 'is not a score'],
    ['+5', 'is not a score'],
    ['1,234', 'is ambiguous'],
    ['1.2.3', 'malformed digit grouping'],
    ['12 34', 'malformed digit grouping'],
    ['1,2,3', 'malformed digit grouping'],
    ['1.234 567,5', 'malformed digit grouping'],
    ['5.', 'malformed decimal part'],
    ['3/0', 'divides by zero'],
    ['/4', 'numerator that is empty'],
    ['3/x', 'denominator that is not a score'],
    ['%', 'is empty'],
  ])('%s → %s', (cell, why) => {
    const m = message(cell);
    expect(m).toContain(`"${cell}"`);
    expect(m).toContain(why);
    expect(m).toContain(accepted);
    expect(m).toContain('excused ("EX", "excused", "exc")');
    expect(m).toContain('missing (blank, "-"');
  });

  it('numbers that are negative or not finite', () => {
    expect(message(-1)).toContain('"-1" is negative');
    expect(message(Number.NaN)).toContain('"NaN" is not a finite number');
    expect(message(Number.POSITIVE_INFINITY)).toContain('is not a finite number');
  });

  it('fractions and percents need points possible', () => {
    expect(message('85%', 0)).toContain("needs the assessment's points possible (got 0)");
    expect(message('9/10', Number.NaN)).toContain('got NaN');
    expect(points('9', 0)).toBe(9); // plain points do not need it
  });
});

describe('formatScore', () => {
  it('writes the first token of each state and numbers as typed', () => {
    expect(formatScore({ kind: 'excused' })).toBe('EX');
    expect(formatScore({ kind: 'missing' })).toBe('');
    expect(formatScore({ kind: 'pending' })).toBe('pending');
    expect(formatScore({ kind: 'earned', points: 7.5 })).toBe('7.5');
    expect(formatScore({ kind: 'excused' }, { excused: [], missing: [], pending: [] })).toBe('excused');
  });

  it('property: parseScore(formatScore(s)) = s with the default tokens', () => {
    const score = fc.oneof(
      fc.constant({ kind: 'excused' as const }),
      fc.constant({ kind: 'missing' as const }),
      fc.constant({ kind: 'pending' as const }),
      fc.double({ min: 0, max: 1e6, noNaN: true }).map((points) => ({ kind: 'earned' as const, points: points === 0 ? 0 : points })),
    );
    fc.assert(
      fc.property(score, (s) => {
        if (s.kind === 'earned' && /e/.test(String(s.points))) return; // exponent form is not a typed score
        const back = parseScore(formatScore(s), 20, DEFAULT_TOKENS);
        expect(back).toEqual({ ok: true, score: s });
      }),
    );
  });
});
