/**
 * What a column header says about the column. Header words of the trade (ID, name, section,
 * e-mail; totals, comments and dates that are not scores) — common practice, no source. A header
 * that names none of them is decided by its cells (see detectLayout).
 */
import type { ColumnRole } from '../../../renderer/bridge/contract';

/** Lower case, compatibility-folded, "#" read as "no", punctuation as spaces, spaces collapsed. */
export function normaliseHeader(header: string): string {
  return header
    .normalize('NFKC')
    .toLowerCase()
    .replace(/#/g, ' no ')
    .replace(/[^\p{L}\p{N}%]+/gu, ' ')
    .trim();
}

const RULES: readonly { readonly role: ColumnRole; readonly test: RegExp }[] = [
  { role: 'email', test: /^(student )?e ?mail( address)?$|\be ?mail\b/ },
  // A few words of the languages gradebooks here are often exported in (German, French, Spanish).
  { role: 'firstName', test: /^(student )?(first|given|fore) ?names?$|^first$|^vorname$|^pr[ée]noms?$/ },
  { role: 'lastName', test: /^(student )?(last|family|sur) ?names?$|^last$|^(nach|familien)name$|^nom( de famille)?$|^apellidos?$/ },
  {
    role: 'id',
    test: /^(student )?(id|sid|number|no|nr|num|code|identifier)( number| no| nr)?$|^student ?id\b|^id number$|^student number$|\bmatri[ck]|^matr( nr| no)?$|^registration (number|no)$|^reg no$/,
  },
  { role: 'name', test: /^(student |full )?names?\b|^student$|^nombre( completo)?$/ },
  // Bare "Lab" / "Tutorial" are left out: far more often an assessment ("Lab", "Lab 1") than a section.
  { role: 'section', test: /^(class |lab |tutorial |lecture )?(section|sec|group|class|cohort|stream)( name| no| number| code)?$|^(lab|tutorial) (group|section)$|^(gruppe|groupe|grupo|secci[oó]n)$/ },
  {
    role: 'ignore',
    test: /\b(total|totals|sum|average|avg|mean|grade|grades|letter|comment|comments|note|notes|remark|remarks|date|dates|rank|percent|percentage|gpa|username|login|status|summe|gesamt|datum|bemerkung|kommentar|commentaire)\b|(^|\s)%(\s|$)/,
  },
];

/** The role a header names, or null when only the cells can tell. */
export function roleFromHeader(header: string): ColumnRole | null {
  const h = normaliseHeader(header);
  if (h === '') return null;
  for (const rule of RULES) if (rule.test.test(h)) return rule.role;
  return null;
}

/** First cell of a "points possible" row: "Points possible", "Max", "Out of", "Possible" … */
export const POSSIBLE_ROW_LABEL = /^(points?( possible| available)?|possible( points)?|max(imum)?( points| score| marks)?|out of|full marks|pts|punkte|max(imal)? punkte|puntos)\b/i;

/** Rows of computed figures below the students: "Average", "Class mean", "Total" … */
export const SUMMARY_ROW_LABEL = /^(class |section |course )?(total|totals|sum|average|avg|mean|median|max|maximum|min|minimum|count|std|sd|standard deviation)\b/i;

const NUMBER = String.raw`(\d+(?:[.,]\d+)?)`;
const HEADER_POSSIBLE: readonly RegExp[] = [
  // "Quiz 1 (20)", "Quiz 1 (20 pts)", "Quiz 1 (out of 20)", "Quiz 1 (max 20)", "Quiz 1 (/20)"
  new RegExp(String.raw`\(\s*(?:out of\s*|max\.?\s*|/\s*)?${NUMBER}\s*(?:pts?\.?|points?|marks?)?\s*\)\s*$`, 'i'),
  // "Quiz 1 [20]"
  new RegExp(String.raw`\[\s*${NUMBER}\s*(?:pts?\.?|points?|marks?)?\s*\]\s*$`, 'i'),
  // "Quiz 1 /20", "Quiz 1 / 20"
  new RegExp(String.raw`\s/\s*${NUMBER}\s*$`),
  // "Quiz 1 out of 20", "Quiz 1 max 20"
  new RegExp(String.raw`\s(?:out of|max\.?)\s*${NUMBER}\s*$`, 'i'),
  // "Quiz 1 - 20 pts", "Quiz 1: 20 points"
  new RegExp(String.raw`[\s\-–:]\s*${NUMBER}\s*(?:pts?\.?|points|marks)\s*$`, 'i'),
];

/** Points possible written in the header, and the header without it ("Quiz 1 (20)" → 20, "Quiz 1"). */
export function possibleFromHeader(header: string): { possible: number; name: string } | null {
  for (const re of HEADER_POSSIBLE) {
    const m = re.exec(header);
    const digits = m?.[1];
    if (m === null || digits === undefined) continue;
    const possible = Number(digits.replace(',', '.'));
    if (!Number.isFinite(possible)) continue;
    const name = header.slice(0, m.index).replace(/[\s\-–:,]+$/, '').trim();
    return { possible, name: name === '' ? header.trim() : name };
  }
  return null;
}
