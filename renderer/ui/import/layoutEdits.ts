/**
 * The user's corrections to a detected import layout, as pure functions over ImportLayout so the
 * Import workspace holds one value and every change is a new layout (re-checked by a dry run).
 */
import type { ColumnLayout, ColumnRole, ImportLayout, ScoreTokens, SheetLayout, SheetPreview } from '../../bridge/contract';

export const roleLabels: Readonly<Record<ColumnRole, string>> = {
  id: 'Student ID',
  name: 'Name',
  firstName: 'First name',
  lastName: 'Last name',
  section: 'Section',
  email: 'E-mail',
  assessment: 'Assessment',
  ignore: 'Ignore',
};

export const roleOrder: readonly ColumnRole[] = ['id', 'name', 'firstName', 'lastName', 'section', 'email', 'assessment', 'ignore'];

function mapSheet(layout: ImportLayout, sheet: string, f: (s: SheetLayout) => SheetLayout): ImportLayout {
  return { ...layout, sheets: layout.sheets.map((s) => (s.sheet === sheet ? f(s) : s)) };
}

function mapColumn(layout: ImportLayout, sheet: string, index: number, f: (c: ColumnLayout) => ColumnLayout): ImportLayout {
  return mapSheet(layout, sheet, (s) => ({ ...s, columns: s.columns.map((c) => (c.index === index ? f(c) : c)) }));
}

export function setColumnRole(layout: ImportLayout, sheet: string, index: number, role: ColumnRole): ImportLayout {
  return mapColumn(layout, sheet, index, (c) => {
    // Points possible belongs to assessment columns only; keep a typed value while it still is one.
    const { possible, ...rest } = c;
    return role === 'assessment' && possible !== undefined ? { ...rest, role, possible } : { ...rest, role };
  });
}

/** null clears a typed value, so points possible comes from the file again. */
export function setColumnPossible(layout: ImportLayout, sheet: string, index: number, possible: number | null): ImportLayout {
  return mapColumn(layout, sheet, index, (c) => {
    const { possible: _old, ...rest } = c;
    return possible === null ? rest : { ...rest, possible };
  });
}

/** Columns read from a header row: one per non-blank header cell, roles kept by column where known. */
export function columnsFromRow(row: readonly string[], previous: readonly ColumnLayout[]): ColumnLayout[] {
  const byIndex = new Map(previous.map((c) => [c.index, c]));
  const columns: ColumnLayout[] = [];
  row.forEach((text, index) => {
    const header = text.trim();
    if (header === '') return;
    const before = byIndex.get(index);
    columns.push(before !== undefined ? { ...before, header } : { index, header, role: 'ignore' });
  });
  return columns;
}

export function setHeaderRow(layout: ImportLayout, preview: SheetPreview, headerRow: number): ImportLayout {
  return mapSheet(layout, preview.name, (s) => ({
    ...s,
    headerRow,
    possibleRow: s.possibleRow === headerRow ? null : s.possibleRow,
    columns: columnsFromRow(preview.rows[headerRow] ?? [], headerRow === s.headerRow ? s.columns : s.columns.map(({ possible: _p, ...c }) => c)),
  }));
}

export function setPossibleRow(layout: ImportLayout, sheet: string, possibleRow: number | null): ImportLayout {
  return mapSheet(layout, sheet, (s) => ({ ...s, possibleRow }));
}

/**
 * A layout for a sheet the detector did not choose: the first chosen sheet's rows and roles when
 * this sheet has the same header (one sheet per section), else its first row as header, every
 * column ignored until the user says otherwise.
 */
export function defaultSheetLayout(preview: SheetPreview, template: SheetLayout | undefined): SheetLayout {
  if (template !== undefined) {
    const row = preview.rows[template.headerRow] ?? [];
    const same = template.columns.every((c) => (row[c.index] ?? '').trim() === c.header);
    if (same) return { ...template, sheet: preview.name };
  }
  return { sheet: preview.name, headerRow: 0, possibleRow: null, columns: columnsFromRow(preview.rows[0] ?? [], []) };
}

export function setSheetIncluded(layout: ImportLayout, preview: SheetPreview, included: boolean, order: readonly string[]): ImportLayout {
  const has = layout.sheets.some((s) => s.sheet === preview.name);
  if (included === has) return layout;
  if (!included) return { ...layout, sheets: layout.sheets.filter((s) => s.sheet !== preview.name) };
  const sheets = [...layout.sheets, defaultSheetLayout(preview, layout.sheets[0])];
  // Keep the workbook's sheet order, so the roster order does not depend on click order.
  sheets.sort((a, b) => order.indexOf(a.sheet) - order.indexOf(b.sheet));
  return { ...layout, sheets };
}

/** "EX, excused , exc" → ["EX", "excused", "exc"]; an empty entry means a blank cell. */
export function parseTokenList(text: string): string[] {
  if (text.trim() === '') return [];
  return text.split(',').map((t) => t.trim());
}

export function formatTokenList(tokens: readonly string[]): string {
  return tokens.map((t) => (t === '' ? '(blank)' : t)).join(', ');
}

/** Accepts the "(blank)" shown by formatTokenList back as the blank token. */
export function readTokenList(text: string): string[] {
  return parseTokenList(text).map((t) => (t.toLowerCase() === '(blank)' ? '' : t));
}

export function setTokens(layout: ImportLayout, kind: keyof ScoreTokens, list: readonly string[]): ImportLayout {
  return { ...layout, tokens: { ...layout.tokens, [kind]: list } };
}

/** Assessment columns of the layout in sheet order, for the "will be imported" list. */
export function assessmentColumns(layout: ImportLayout): { sheet: string; column: ColumnLayout }[] {
  const seen = new Set<string>();
  const out: { sheet: string; column: ColumnLayout }[] = [];
  for (const s of layout.sheets) {
    for (const c of s.columns) {
      if (c.role !== 'assessment' || seen.has(c.header)) continue;
      seen.add(c.header);
      out.push({ sheet: s.sheet, column: c });
    }
  }
  return out;
}

/**
 * A course title for a new import: the first text above the header row (exports often start with
 * a title line), else the file name without its extension.
 */
export function titleFor(preview: { fileName: string; sheets: readonly SheetPreview[] }, layout: ImportLayout): string {
  const first = layout.sheets[0];
  const sheet = preview.sheets.find((s) => s.name === first?.sheet);
  if (first !== undefined && sheet !== undefined) {
    for (let r = 0; r < first.headerRow; r++) {
      const text = (sheet.rows[r] ?? []).map((c) => c.trim()).find((c) => c !== '');
      if (text !== undefined) return text.length > 120 ? `${text.slice(0, 119)}…` : text;
    }
  }
  return preview.fileName.replace(/\.[^.]+$/, '') || preview.fileName;
}
