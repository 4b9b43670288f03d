/**
 * Plain-words caution for comparing sections. `names` (optional, index-aligned with `ns`) name the
 * sections in the text; without them sections are numbered from 1.
 *
 * Groups under SMALL_GROUP_N students make tests and effect sizes unstable (threshold: common
 * practice, no source). Sections are never randomly assigned, so a difference between them may
 * come from who enrolled, the timetable or the marker rather than the teaching — this note is
 * always included. Returns null only when there are no groups at all.
 * @example
 * smallGroupCaution([12, 30]);
 * // => "Small groups: section 1 has only 12 students (fewer than 20). … Students were not randomly assigned …"
 */
export const SMALL_GROUP_N = 20;

export function smallGroupCaution(ns: readonly number[], names?: readonly string[]): string | null {
  if (ns.length === 0) return null;
  const nameOf = (i: number): string => `section ${names?.[i] ?? String(i + 1)}`;
  const parts: string[] = [];
  const small = ns.map((n, i) => ({ n, i })).filter((g) => g.n < SMALL_GROUP_N);
  if (small.length > 0) {
    const list = small.map((g) => `${nameOf(g.i)} has ${g.n === 1 ? 'only 1 student' : `only ${g.n} students`}`).join('; ');
    parts.push(
      `Small groups: ${list} (fewer than ${SMALL_GROUP_N}). With so few marks, one or two students can change the result; read p-values and effect sizes as rough indications only.`,
    );
  }
  parts.push(
    'Students were not randomly assigned to sections, so a difference between sections may reflect who enrolled, the timetable or the marking, not only the teaching.',
  );
  return parts.join(' ');
}
