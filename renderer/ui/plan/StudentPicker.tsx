/**
 * Choose one student from a roster of any size: type part of a name or ID, pick from the first
 * matches. (A plain select of 10 000 students would be slow to render and slow to use.)
 */
import { useId, useMemo, useState } from 'react';
import type { Student } from '../../engine/model';

const MAX_MATCHES = 200;

export function StudentPicker({ label, students, value, onChange }: {
  label: string;
  students: readonly Student[];
  /** Selected student index, or null. */
  value: number | null;
  onChange(index: number | null): void;
}) {
  const searchId = useId();
  const selectId = useId();
  const [query, setQuery] = useState('');
  const matches = useMemo(() => {
    const needle = query.trim().toLowerCase();
    const out: number[] = [];
    for (let i = 0; i < students.length && out.length < MAX_MATCHES; i++) {
      const s = students[i];
      if (s === undefined) continue;
      if (needle === '' || s.name.toLowerCase().includes(needle) || s.id.toLowerCase().includes(needle)) out.push(i);
    }
    if (value !== null && !out.includes(value)) out.unshift(value);
    return out;
  }, [students, query, value]);

  return (
    <span className="wb-student-picker">
      <label htmlFor={searchId}>{label}: find by name or ID</label>
      <input id={searchId} type="search" value={query} onChange={(e) => setQuery(e.target.value)} placeholder="Name or ID" />
      <label htmlFor={selectId} className="wb-visually-hidden">{label}</label>
      <select id={selectId} value={value === null ? '' : String(value)} onChange={(e) => onChange(e.target.value === '' ? null : Number(e.target.value))}>
        <option value="">Choose a student…</option>
        {matches.map((i) => {
          const s = students[i];
          return s === undefined ? null : <option key={s.id} value={String(i)}>{s.name} ({s.id}, section {s.section})</option>;
        })}
      </select>
    </span>
  );
}
