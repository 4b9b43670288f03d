/**
 * Building located import problems. Every message starts with where the problem is, in the words
 * the user's spreadsheet program shows (sheet, 1-based row, column letter, header), then says what
 * was found and how to fix it.
 */
import type { CellLocation, ImportProblem } from '../../../renderer/bridge/contract';

/** 'Sheet "Sec A", row 5, column C ("Quiz 1")' — omits the parts that are not known. */
export function describeLocation(at: CellLocation): string {
  const parts = [`Sheet "${at.sheet}"`];
  if (at.row !== undefined) parts.push(`row ${at.row}`);
  if (at.column !== undefined) {
    parts.push(at.header !== undefined && at.header !== '' ? `column ${at.column} (${quote(at.header)})` : `column ${at.column}`);
  }
  return parts.join(', ');
}

export function problemAt(
  severity: ImportProblem['severity'],
  code: string,
  at: CellLocation,
  detail: string,
): ImportProblem {
  const clean: CellLocation = stripUndefined(at);
  return { severity, code, message: boundMessage(`${describeLocation(clean)}: ${detail}`), at: clean };
}

/** A problem about the whole file (no sheet to point at). */
export function fileProblem(severity: ImportProblem['severity'], code: string, message: string): ImportProblem {
  return { severity, code, message: boundMessage(message) };
}

export function hasErrors(problems: readonly ImportProblem[]): boolean {
  return problems.some((p) => p.severity === 'error');
}

/** Cell text for a message: quoted, shortened so one absurd cell cannot flood the report. */
export function quote(value: string): string {
  return `"${shorten(value, 80)}"`;
}

/** Longest header or value kept in a problem's location: enough to recognise, never megabytes. */
const MAX_KEPT = 200;
/** Longest message; details quoted from cells are already shortened, this bounds the rest. */
const MAX_MESSAGE = 1000;

function shorten(text: string, max: number): string {
  return text.length > max ? `${text.slice(0, max)}…` : text;
}

/**
 * Callers quote cell text with quote(), so only a long file name or library detail can get here;
 * cut in the middle so the start (the place) and the end (the fix) both survive.
 */
function boundMessage(message: string): string {
  if (message.length <= MAX_MESSAGE) return message;
  const half = Math.floor((MAX_MESSAGE - 1) / 2);
  return `${message.slice(0, half)}…${message.slice(message.length - half)}`;
}

function stripUndefined(at: CellLocation): CellLocation {
  const out: { sheet: string; row?: number; column?: string; header?: string; value?: string } = { sheet: at.sheet };
  if (at.row !== undefined) out.row = at.row;
  if (at.column !== undefined) out.column = at.column;
  if (at.header !== undefined) out.header = shorten(at.header, MAX_KEPT);
  if (at.value !== undefined) out.value = shorten(at.value, MAX_KEPT);
  return out;
}
