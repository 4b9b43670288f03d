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
  if (typeof cell === 'number') {
    if (!Number.isFinite(cell)) return fail(String(cell), 'is not a finite number', tokens);
    if (cell < 0) return fail(String(cell), 'is negative; scores cannot be below 0', tokens);
    return earned(cell);
  }
  const text = (cell ?? '').trim();
  const state = tokenState(text, tokens);
  if (state !== null) return { ok: true, score: { kind: state } };
  if (text === '') return { ok: true, score: { kind: 'missing' } };

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

function tokenState(text: string, tokens: ScoreTokens): 'excused' | 'missing' | 'pending' | null {
  const key = text.toLowerCase();
  const has = (words: readonly string[]): boolean => words.some((w) => w.trim().toLowerCase() === key);
  if (has(tokens.excused)) return 'excused';
  if (has(tokens.missing)) return 'missing';
  if (has(tokens.pending)) return 'pending';
  return null;
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
