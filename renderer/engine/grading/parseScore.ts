/**
 * Score cell parsing: spreadsheet cell → typed Score, before any arithmetic.
 *
 * Accepted forms (cell text trimmed first):
 *   - a state token (excused / missing / pending), matched trimmed and case-insensitively;
 *     a blank cell is whatever state lists the empty token, and `missing` when none does;
 *   - a non-negative number: `17`, `7.5`, `7,5` (decimal comma), `1 234,5` / `1.234,5` /
 *     `1,234.5` / `1'234.5` (grouped thousands, accepted only where the reading is unambiguous);
 *   - a fraction `a/b` → a ÷ b × possible (`18/20` on a 10-point item is 9 points);
 *   - a percent `p%` → p ÷ 100 × possible.
 * A lone comma followed by exactly three digits (`1,234`) is refused: it reads as 1234 in some
 * locales and 1.234 in others. A lone dot is always the decimal point (`1.234` = 1.234).
 * Negative numbers are refused (a mark below zero is a typing error far more often than a rule).
 *
 * Source: decimal comma and digit grouping conventions — ISO 80000-1:2009 §7.3.1 (space grouping,
 * comma or point as decimal sign) and common spreadsheet practice (point/comma/apostrophe
 * grouping) — common practice.
 */
import type { Score } from '../model';

/**
 * Cell text tokens that mean each non-numeric state (the bridge contract re-exports this type).
 */
export interface ScoreTokens {
  readonly excused: readonly string[];
  readonly missing: readonly string[];
  readonly pending: readonly string[];
}

/**
 * Defaults. `P` is deliberately not a pending token: in many gradebooks `P` means "pass".
 * Dashes cover the hyphen and the en/em dashes that spreadsheet autocorrect produces.
 */
export const DEFAULT_TOKENS: ScoreTokens = {
  excused: ['EX', 'excused', 'exc'],
  missing: ['', '-', '–', '—', 'missing', 'M'],
  pending: ['pending', 'TBD'],
};

export type ParseScoreResult = { ok: true; score: Score } | { ok: false; message: string };

const GROUP_SPACES = /[ \u00a0\u202f\u2009]/;

/**
 * Parse one cell. `possible` (> 0) is needed only to scale fractions and percents.
 * The message on failure says what was seen and what is accepted; the caller adds the place.
 */
export function parseScore(
  cell: string | number | null | undefined,
  possible: number,
  tokens: ScoreTokens,
): ParseScoreResult {
  return readCell(cell, possible, tokens, tableFor(tokens), true);
}

/**
 * The token table of the lists `parseScore` was last called with (the layout detection calls it
 * for thousands of cells with the same lists): rebuilt whenever a list or a word in it is not the
 * one it was built from, so a change to the lists is always seen.
 */
let lastTable: { readonly tokens: ScoreTokens; readonly words: ScoreTokens; readonly table: TokenTable } | null = null;

function tableFor(tokens: ScoreTokens): TokenTable {
  const last = lastTable;
  if (last !== null && last.tokens === tokens && sameList(tokens.excused, last.words.excused) && sameList(tokens.missing, last.words.missing) && sameList(tokens.pending, last.words.pending)) {
    return last.table;
  }
  const words: ScoreTokens = { excused: [...tokens.excused], missing: [...tokens.missing], pending: [...tokens.pending] };
  const table = tokenTable(words);
  lastTable = { tokens, words, table };
  return table;
}

function sameList(list: readonly string[], copy: readonly string[]): boolean {
  if (list.length !== copy.length) return false;
  for (let i = 0; i < list.length; i++) if (list[i] !== copy[i]) return false;
  return true;
}

/** `parseScore` with the token lists fixed: what an import calls once per cell. */
export type ScoreReader = (cell: string | number | null | undefined, possible: number) => ParseScoreResult;

/**
 * A `parseScore` for many cells with the same tokens: the token lists are looked up in a table
 * built here once (they are read now; a later change to them is not seen), instead of being
 * trimmed and lower-cased again for every cell. Same results as `parseScore`.
 *
 * A column holds few distinct values (17, 17.5, EX …), so results that do not depend on
 * `possible` (numbers, and text without "%" or "/") are remembered, up to MEMO_LIMIT of them, and
 * handed out again: they are frozen and shared, as every Score is read-only. Plain decimal text
 * ("17", "7.5") is recognised by its digits and looked up by their value, without hashing the text.
 */
export function scoreReader(tokens: ScoreTokens): ScoreReader {
  const table = tokenTable(tokens);
  const memo = new Map<string | number, ParseScoreResult>();
  // Indexed by plainDigitsCode: a dense array for values below 1000 (every usual score), a Map above.
  const smallDigits: (ParseScoreResult | undefined)[] = new Array<ParseScoreResult | undefined>(SMALL_CODES).fill(undefined);
  const byDigits = new Map<number, ParseScoreResult>();
  // A token spelled like a number ("0" for missing) must win over the number: no shortcut then.
  let digitsShortcut = true;
  for (const key of table.keys()) if (plainDecimal(key) !== null) digitsShortcut = false;
  const blank = frozen(readCell('', 1, tokens, table, true));
  return (cell, possible) => {
    if (cell === null || cell === undefined || cell === '') return blank;
    if (digitsShortcut && typeof cell === 'string') {
      const code = plainDigitsCode(cell);
      if (code >= 0 && code < SMALL_CODES) {
        const known = smallDigits[code];
        if (known !== undefined) return known;
        const result = frozen(readCell(cell, possible, tokens, table, true));
        smallDigits[code] = result;
        return result;
      }
      if (code >= 0) {
        const known = byDigits.get(code);
        if (known !== undefined) return known;
        const result = frozen(readCell(cell, possible, tokens, table, true));
        if (byDigits.size < MEMO_LIMIT) byDigits.set(code, result);
        return result;
      }
    }
    const known = memo.get(cell);
    if (known !== undefined) return known;
    const result = readCell(cell, possible, tokens, table, true);
    if (memo.size >= MEMO_LIMIT || (typeof cell === 'string' && (cell.includes('%') || cell.includes('/')))) return result;
    const shared = frozen(result);
    memo.set(cell, shared);
    return shared;
  };
}

const MEMO_LIMIT = 4096;
/** plainDigitsCode values of 0 … 999.99. */
const SMALL_CODES = 100_000;

/**
 * Plain decimal text with at most 5 integer digits and 2 decimals ("17", "07.5", "99999.99") → a
 * code that is equal for two texts exactly when they have the same value ("7.5" and "07.50"), and
 * so the same parse: units × 100 + hundredths, with units < 100 000. Any other text → -1.
 */
function plainDigitsCode(text: string): number {
  const n = text.length;
  let units = 0;
  let i = 0;
  for (; i < n; i++) {
    const d = text.charCodeAt(i) - 48;
    if (d < 0 || d > 9) break;
    units = units * 10 + d;
  }
  if (i === 0 || units >= 100_000) return -1;
  let hundredths = 0;
  if (i < n) {
    const dot = i;
    if (text.charCodeAt(dot) !== 46 /* . */ || n - dot - 1 < 1 || n - dot - 1 > 2) return -1;
    for (i++; i < n; i++) {
      const d = text.charCodeAt(i) - 48;
      if (d < 0 || d > 9) return -1;
      hundredths = hundredths * 10 + d;
    }
    if (n - dot === 2) hundredths *= 10; // one decimal written: tenths
  }
  return units * 100 + hundredths;
}

function frozen(result: ParseScoreResult): ParseScoreResult {
  return result.ok ? Object.freeze({ ok: true, score: Object.freeze(result.score) }) : Object.freeze(result);
}

/**
 * The grammar alone, without the plain-number shortcut: the reference the shortcut is
 * property-tested against (tests/engine/grading/parseScoreFast.test.ts). Same results as `parseScore`.
 */
export function parseScoreByGrammar(
  cell: string | number | null | undefined,
  possible: number,
  tokens: ScoreTokens,
): ParseScoreResult {
  return readCell(cell, possible, tokens, null, false);
}

type TokenState = 'excused' | 'missing' | 'pending';
type TokenTable = ReadonlyMap<string, TokenState>;

function readCell(
  cell: string | number | null | undefined,
  possible: number,
  tokens: ScoreTokens,
  table: TokenTable | null,
  shortcut: boolean,
): ParseScoreResult {
  if (typeof cell === 'number') {
    if (!Number.isFinite(cell)) return fail(String(cell), 'is not a finite number', tokens);
    if (cell < 0) return fail(String(cell), 'is negative; scores cannot be below 0', tokens);
    return earned(cell);
  }
  const text = (cell ?? '').trim();
  const key = text.toLowerCase();
  const state = table === null ? tokenState(key, tokens) : (table.get(key) ?? null);
  if (state !== null) return { ok: true, score: { kind: state } };
  if (text === '') return { ok: true, score: { kind: 'missing' } };
  if (shortcut) {
    const plain = plainDecimal(text);
    if (plain !== null) return earned(plain);
  }

  if (text.endsWith('%')) {
    const value = parseDecimal(text.slice(0, -1).trim());
    if (!value.ok) return fail(text, value.why, tokens);
    const scale = checkPossible(possible, text, tokens);
    if (scale !== null) return scale;
    return earned((value.value * possible) / 100);
  }
  const slash = text.indexOf('/');
  if (slash >= 0) {
    const top = parseDecimal(text.slice(0, slash).trim());
    if (!top.ok) return fail(text, `has a numerator that ${top.why}`, tokens);
    const bottom = parseDecimal(text.slice(slash + 1).trim());
    if (!bottom.ok) return fail(text, `has a denominator that ${bottom.why}`, tokens);
    if (bottom.value === 0) return fail(text, 'divides by zero', tokens);
    const scale = checkPossible(possible, text, tokens);
    if (scale !== null) return scale;
    // a × possible ÷ b keeps 18/20 on a 20-point item exactly 18.
    return earned((top.value * possible) / bottom.value);
  }
  const value = parseDecimal(text);
  if (!value.ok) return fail(text, value.why, tokens);
  return earned(value.value);
}

/**
 * The shortcut for the common cell: digits, optionally one `.` and more digits ("17", "7.5").
 * The grammar reads such text as Number(`${int}.${frac || '0'}`), the same decimal value as
 * Number(text); anything else (commas, spaces, signs, "5.", ".5", too large) is left to it.
 */
function plainDecimal(text: string): number | null {
  const n = text.length;
  let i = 0;
  while (i < n && isDigit(text.charCodeAt(i))) i++;
  if (i === 0) return null;
  if (i < n) {
    if (text.charCodeAt(i) !== 46 /* . */) return null;
    i++;
    const fracStart = i;
    while (i < n && isDigit(text.charCodeAt(i))) i++;
    if (i !== n || i === fracStart) return null;
  }
  const value = Number(text);
  return Number.isFinite(value) ? value : null;
}

function isDigit(code: number): boolean {
  return code >= 48 && code <= 57;
}

/** Display/export form: the number as typed, or the first token of the state (canonical word if none). */
export function formatScore(s: Score, tokens: ScoreTokens = DEFAULT_TOKENS): string {
  switch (s.kind) {
    case 'earned':
      return String(s.points);
    case 'excused':
      return tokens.excused[0] ?? 'excused';
    case 'missing':
      return tokens.missing[0] ?? 'missing';
    case 'pending':
      return tokens.pending[0] ?? 'pending';
  }
}

/** "accepted: …" — the list of forms, shared by every message so they read the same. */
export function acceptedForms(tokens: ScoreTokens): string {
  const list = (words: readonly string[]): string =>
    words.map((w) => (w.trim() === '' ? 'blank' : `"${w.trim()}"`)).join(', ') || 'none';
  return (
    'use a number of points (17, 7.5 or 7,5), a fraction (18/20), a percent (85%), ' +
    `excused (${list(tokens.excused)}), missing (${list(tokens.missing)}) or pending (${list(tokens.pending)})`
  );
}

/** `key` is the cell text trimmed and lower-cased; the first list holding it wins. */
function tokenState(key: string, tokens: ScoreTokens): TokenState | null {
  if (listHas(tokens.excused, key)) return 'excused';
  if (listHas(tokens.missing, key)) return 'missing';
  if (listHas(tokens.pending, key)) return 'pending';
  return null;
}

function listHas(words: readonly string[], key: string): boolean {
  for (const w of words) if (w.trim().toLowerCase() === key) return true;
  return false;
}

/** The same decision as `tokenState`, as a table: first list (excused, missing, pending) wins. */
function tokenTable(tokens: ScoreTokens): TokenTable {
  const table = new Map<string, TokenState>();
  const add = (words: readonly string[], state: TokenState): void => {
    for (const w of words) {
      const key = w.trim().toLowerCase();
      if (!table.has(key)) table.set(key, state);
    }
  };
  add(tokens.excused, 'excused');
  add(tokens.missing, 'missing');
  add(tokens.pending, 'pending');
  return table;
}

function earned(points: number): ParseScoreResult {
  return { ok: true, score: { kind: 'earned', points: points === 0 ? 0 : points } };
}

function fail(seen: string, why: string, tokens: ScoreTokens): ParseScoreResult {
  return { ok: false, message: `"${seen}" ${why}; ${acceptedForms(tokens)}.` };
}

function checkPossible(possible: number, text: string, tokens: ScoreTokens): ParseScoreResult | null {
  if (Number.isFinite(possible) && possible > 0) return null;
  void tokens;
  return {
    ok: false,
    message: `"${text}" is a fraction or percent, which needs the assessment's points possible (got ${possible}); set points possible above 0 or enter points.`,
  };
}

type Decimal = { ok: true; value: number } | { ok: false; why: string };

/**
 * Non-negative decimal with optional grouping. Decides which separator is the decimal sign:
 * both `.` and `,` present → the last one is; several of one kind → grouping; one `,` before
 * exactly three digits → ambiguous; otherwise the single `.` or `,` is the decimal sign.
 */
function parseDecimal(raw: string): Decimal {
  if (raw === '') return { ok: false, why: 'is empty' };
  if (raw.startsWith('-') || raw.startsWith('−')) return { ok: false, why: 'is negative; scores cannot be below 0' };
  if (!/^[0-9.,' \u00a0\u202f\u2009\u2019]+$/.test(raw) || !/[0-9]/.test(raw)) {
    return { ok: false, why: 'is not a score' };
  }
  const body = raw.replace(/[\u2019]/g, "'");
  const lastDot = body.lastIndexOf('.');
  const lastComma = body.lastIndexOf(',');
  const dots = count(body, '.');
  const commas = count(body, ',');
  let decimalSign: '.' | ',' | null = null;
  if (dots > 0 && commas > 0) decimalSign = lastDot > lastComma ? '.' : ',';
  else if (dots === 1) decimalSign = '.';
  else if (commas === 1) {
    if (/^[1-9][0-9]{0,2},[0-9]{3}$/.test(body)) {
      return { ok: false, why: 'is ambiguous (thousands or decimal comma?); write 1234 or 1.234 without grouping' };
    }
    decimalSign = ',';
  }
  let intPart = body;
  let fracPart = '';
  if (decimalSign !== null) {
    const at = body.lastIndexOf(decimalSign);
    intPart = body.slice(0, at);
    fracPart = body.slice(at + 1);
    if (!/^[0-9]+$/.test(fracPart)) return { ok: false, why: 'has a malformed decimal part' };
  }
  const intDigits = ungroup(intPart);
  if (intDigits === null) return { ok: false, why: 'has malformed digit grouping (groups of three digits expected)' };
  if (intDigits === '' && fracPart === '') return { ok: false, why: 'is not a score' };
  const value = Number(`${intDigits === '' ? '0' : intDigits}.${fracPart === '' ? '0' : fracPart}`);
  return Number.isFinite(value) ? { ok: true, value } : { ok: false, why: 'is too large' };
}

/** "1 234" / "1.234.567" / "1'234" → digits; one kind of separator, first group 1–3 digits, then 3s. */
function ungroup(intPart: string): string | null {
  if (/^[0-9]*$/.test(intPart)) return intPart;
  const separators = new Set(intPart.replace(/[0-9]/g, '').split('').map((c) => (GROUP_SPACES.test(c) ? ' ' : c)));
  if (separators.size !== 1) return null;
  const groups = intPart.split(/[^0-9]/);
  const [first, ...rest] = groups;
  if (first === undefined || !/^[0-9]{1,3}$/.test(first) || rest.length === 0) return null;
  if (!rest.every((g) => /^[0-9]{3}$/.test(g))) return null;
  return groups.join('');
}

function count(text: string, ch: string): number {
  let n = 0;
  for (const c of text) if (c === ch) n++;
  return n;
}
