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
    parts.push(at.header !== undefined && at.header !== '' ? `column ${at.column} ("${at.header}")` : `column ${at.column}`);
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
  return { severity, code, message: `${describeLocation(clean)}: ${detail}`, at: clean };
}

/** A problem about the whole file (no sheet to point at). */
export function fileProblem(severity: ImportProblem['severity'], code: string, message: string): ImportProblem {
  return { severity, code, message };
}

export function hasErrors(problems: readonly ImportProblem[]): boolean {
  return problems.some((p) => p.severity === 'error');
}

/** Cell text for a message: quoted, shortened so one absurd cell cannot flood the report. */
export function quote(value: string): string {
  const max = 80;
  const shown = value.length > max ? `${value.slice(0, max)}…` : value;
  return `"${shown}"`;
}

function stripUndefined(at: CellLocation): CellLocation {
  const out: { sheet: string; row?: number; column?: string; header?: string; value?: string } = { sheet: at.sheet };
  if (at.row !== undefined) out.row = at.row;
  if (at.column !== undefined) out.column = at.column;
  if (at.header !== undefined) out.header = at.header;
  if (at.value !== undefined) out.value = at.value;
  return out;
}
