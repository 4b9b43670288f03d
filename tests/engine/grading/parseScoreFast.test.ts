import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { DEFAULT_TOKENS, parseScore, parseScoreByGrammar, scoreReader, type ScoreTokens } from '../../../renderer/engine/grading/parseScore';

// The import reads cells through two shortcuts: plain decimal text ("17", "7.5") is read with
// Number(text) instead of the general grammar, and scoreReader remembers results by text or by
// value. Both must give exactly what the grammar gives. Reference: parseScoreByGrammar (the same
// grammar without the shortcut), whose accepted forms parseScore.test.ts checks against ISO
// 80000-1:2009 §7.3.1 and spreadsheet practice.

/** Strings built from the characters numbers are written with, so the shortcut's edges are hit. */
const numberish = fc
  .array(fc.constantFrom('0', '1', '2', '5', '7', '9', '.', ',', ' ', "'", '-', '%', '/', 'e', '\u00a0'), { minLength: 0, maxLength: 12 })
  .map((cs) => cs.join(''));
/** Plain decimals: digits, optionally a point and digits, with leading zeros and long runs. */
const plain = fc
  .tuple(fc.stringMatching(/^[0-9]{1,25}$/), fc.option(fc.stringMatching(/^[0-9]{0,25}$/)))
  .map(([i, f]) => (f === null ? i : `${i}.${f}`));
const cellText = fc.oneof(numberish, plain, fc.constantFrom('EX', 'ex ', ' pending', 'M', '', '  ', '-', '—', 'TBD', 'abc', '1e5', 'Infinity'));
const possible = fc.constantFrom(1, 10, 20, 0.5, 100, 0, -1);

describe('parseScore shortcuts equal the general grammar', () => {
  it('parseScore(text) deep-equals parseScoreByGrammar(text) on numeric-looking text', () => {
    fc.assert(
      fc.property(cellText, possible, (text, p) => {
        expect(parseScore(text, p, DEFAULT_TOKENS)).toEqual(parseScoreByGrammar(text, p, DEFAULT_TOKENS));
      }),
      { numRuns: 3000 },
    );
  });

  it('a scoreReader used for a whole column gives, cell by cell, what the grammar gives', () => {
    fc.assert(
      fc.property(fc.array(fc.oneof(cellText, fc.double({ noNaN: false }), fc.constant(null)), { maxLength: 60 }), possible, (cells, p) => {
        const read = scoreReader(DEFAULT_TOKENS);
        // Twice over, so the second pass is answered from what the reader remembered.
        for (const cell of [...cells, ...cells]) expect(read(cell, p)).toEqual(parseScoreByGrammar(cell, p, DEFAULT_TOKENS));
      }),
      { numRuns: 500 },
    );
  });

  it('results remembered for one points possible are not reused for fractions or percents of another', () => {
    const read = scoreReader(DEFAULT_TOKENS);
    // 18/20 of a 10-point item is 9 points, of a 20-point item 18 (a ÷ b × possible).
    expect(read('18/20', 10)).toEqual({ ok: true, score: { kind: 'earned', points: 9 } });
    expect(read('18/20', 20)).toEqual({ ok: true, score: { kind: 'earned', points: 18 } });
    expect(read('50%', 10)).toEqual({ ok: true, score: { kind: 'earned', points: 5 } });
    expect(read('50%', 40)).toEqual({ ok: true, score: { kind: 'earned', points: 20 } });
  });

  it('a token spelled like a number still wins over the number', () => {
    const tokens: ScoreTokens = { excused: ['0'], missing: [''], pending: ['7.5'] };
    const read = scoreReader(tokens);
    fc.assert(
      fc.property(fc.oneof(plain, fc.constantFrom('0', '7.5', '00', '7.50')), (text) => {
        expect(read(text, 10)).toEqual(parseScoreByGrammar(text, 10, tokens));
      }),
    );
    expect(read('0', 10)).toEqual({ ok: true, score: { kind: 'excused' } });
    expect(read('7.5', 10)).toEqual({ ok: true, score: { kind: 'pending' } });
    expect(read('7.50', 10)).toEqual({ ok: true, score: { kind: 'earned', points: 7.5 } });
  });

  it('short decimals read in any order by one reader each give their own value', () => {
    // Few digits, so that values close to each other ("7.5", "7.05", "70.5") meet in one column.
    const short = fc
      .tuple(fc.stringMatching(/^[0-9]{1,3}$/), fc.option(fc.stringMatching(/^[0-9]{1,2}$/)))
      .map(([i, f]) => (f === null ? i : `${i}.${f}`));
    fc.assert(
      fc.property(fc.array(short, { minLength: 2, maxLength: 40 }), (texts) => {
        const read = scoreReader(DEFAULT_TOKENS);
        for (const t of texts) expect(read(t, 10)).toEqual(parseScoreByGrammar(t, 10, DEFAULT_TOKENS));
      }),
      { numRuns: 500 },
    );
    const read = scoreReader(DEFAULT_TOKENS);
    expect(read('7.05', 10)).toEqual({ ok: true, score: { kind: 'earned', points: 7.05 } });
    expect(read('7.5', 10)).toEqual({ ok: true, score: { kind: 'earned', points: 7.5 } });
  });

  it('values that share a remembered result are the same number ("7.5", "07.50")', () => {
    const read = scoreReader(DEFAULT_TOKENS);
    for (const [a, b] of [['7.5', '07.50'], ['0', '0.00'], ['12', '012.0'], ['999.99', '0999.99']] as const) {
      const ra = read(a, 10);
      const rb = read(b, 10);
      expect(rb).toEqual(ra);
      expect(rb).toEqual(parseScoreByGrammar(b, 10, DEFAULT_TOKENS));
    }
  });

  it('parseScore sees a change to the token lists between calls (its token table is rebuilt)', () => {
    const word = fc.constantFrom('EX', 'ex', 'M', '', ' 0 ', '7', 'pending', 'TBD', '-', 'abc');
    const lists = fc.record({ excused: fc.array(word, { maxLength: 3 }), missing: fc.array(word, { maxLength: 3 }), pending: fc.array(word, { maxLength: 3 }) });
    fc.assert(
      fc.property(lists, fc.array(fc.tuple(fc.constantFrom('excused', 'missing', 'pending'), fc.nat(3), word), { maxLength: 4 }), fc.array(cellText, { minLength: 1, maxLength: 8 }), (start, edits, cells) => {
        // One mutable token object, edited in place between reads (as a careless caller might).
        const tokens = { excused: [...start.excused], missing: [...start.missing], pending: [...start.pending] };
        for (const [list, at, w] of [['excused', 0, 'EX'] as const, ...edits]) {
          for (const cell of cells) expect(parseScore(cell, 10, tokens)).toEqual(parseScoreByGrammar(cell, 10, tokens));
          const target = tokens[list];
          if (at < target.length) target[at] = w;
          else target.push(w);
        }
        for (const cell of cells) expect(parseScore(cell, 10, tokens)).toEqual(parseScoreByGrammar(cell, 10, tokens));
      }),
      { numRuns: 500 },
    );
  });
});
