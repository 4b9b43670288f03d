/**
 * Roster: every student × every assessment, editable in place.
 *
 * Rows are virtualised (and columns too when there are many assessments), so 10 000+ students
 * scroll as smoothly as 30. The grid follows the ARIA grid pattern: one tab stop (roving
 * tabindex), arrows / Home / End / PageUp / PageDown move, Enter or F2 edits, Escape cancels.
 * While editing, Enter commits and moves down, Tab commits and moves right (Shift+Tab left);
 * outside editing, Tab leaves the grid as the pattern asks.
 *
 * Every edit goes through the course store (`apply({ kind: 'setScore', … })`), so Ctrl+Z undoes it.
 */
import { useCallback, useDeferredValue, useId, useMemo, useState } from 'react';
import { useCourseStore } from '../../state/courseStore';
import { DEFAULT_TOKENS } from '../../engine/grading/parseScore';
import type { Score } from '../../engine/model';
import { studentResultMap } from '../results/resultsAccess';
import { droppedItems } from './droppedItems';
import { RosterGrid } from './RosterGrid';
import './roster.css';

export function RosterWorkspace() {
  const { project, results, apply } = useCourseStore();
  const [section, setSection] = useState<string>('');
  const [search, setSearch] = useState('');
  const deferredSearch = useDeferredValue(search);
  const sectionId = useId();
  const searchId = useId();

  const gradebook = project?.gradebook;
  const sections = useMemo(() => {
    if (gradebook === undefined) return [];
    return [...new Set(gradebook.students.map((s) => s.section))].sort((a, b) => a.localeCompare(b, undefined, { numeric: true }));
  }, [gradebook]);

  const rows = useMemo(() => {
    if (gradebook === undefined) return [];
    const needle = deferredSearch.trim().toLowerCase();
    const out: number[] = [];
    gradebook.students.forEach((s, i) => {
      if (section !== '' && s.section !== section) return;
      if (needle !== '' && !s.name.toLowerCase().includes(needle) && !s.id.toLowerCase().includes(needle)) return;
      out.push(i);
    });
    return out;
  }, [gradebook, section, deferredSearch]);

  const byId = useMemo(() => studentResultMap(results), [results]);
  // The dropped items of each row on screen, from the engine's drop rule for that one student
  // (droppedItems.ts): no explanation lines are built or kept for the rows a scroll passes.
  const plan = project?.plan;
  const droppedFor = useMemo(() => {
    if (gradebook === undefined || plan === undefined) return () => new Set<string>();
    const dropped = droppedItems(gradebook, plan);
    return (studentIndex: number) => dropped.of(studentIndex);
  }, [gradebook, plan]);
  const finalFor = useCallback((studentId: string) => byId.get(studentId)?.final ?? null, [byId]);
  const onSetScore = useCallback(
    (studentIndex: number, assessmentIndex: number, score: Score) => apply({ kind: 'setScore', studentIndex, assessmentIndex, score }),
    [apply],
  );

  const tokens = project?.source?.layout.tokens ?? DEFAULT_TOKENS;

  if (project === null || gradebook === undefined) {
    return (
      <section className="wb-roster" aria-labelledby="wb-roster-title">
        <h1 id="wb-roster-title">Roster</h1>
        <p>No course is open. Open a project or import a spreadsheet first.</p>
      </section>
    );
  }

  return (
    <section className="wb-roster" aria-labelledby="wb-roster-title">
      <header className="wb-roster-toolbar">
        <h1 id="wb-roster-title">Roster</h1>
        <div className="wb-roster-filters" role="search" aria-label="Filter the roster">
          <label htmlFor={sectionId}>Section</label>
          <select id={sectionId} value={section} onChange={(e) => setSection(e.target.value)}>
            <option value="">All sections</option>
            {sections.map((s) => (
              <option key={s} value={s}>{s}</option>
            ))}
          </select>
          <label htmlFor={searchId}>Find student</label>
          <input
            id={searchId}
            type="search"
            placeholder="Name or ID"
            value={search}
            onChange={(e) => setSearch(e.target.value)}
          />
        </div>
        <p className="wb-roster-count" aria-live="polite">
          {rows.length === gradebook.students.length
            ? `${rows.length} students`
            : `${rows.length} of ${gradebook.students.length} students`}
          {` · ${gradebook.assessments.length} assessments`}
        </p>
      </header>
      <Legend />
      <RosterGrid
        gradebook={gradebook}
        rows={rows}
        tokens={tokens}
        finalFor={finalFor}
        droppedFor={droppedFor}
        onSetScore={onSetScore}
      />
    </section>
  );
}

function Legend() {
  return (
    <ul className="wb-roster-legend" aria-label="What the cell marks mean">
      <li><span className="wb-cell-sample wb-cell-excused" aria-hidden="true">EX</span> excused</li>
      <li><span className="wb-cell-sample wb-cell-missing" aria-hidden="true">—</span> missing</li>
      <li><span className="wb-cell-sample wb-cell-pending" aria-hidden="true">…</span> pending</li>
      <li><span className="wb-cell-sample wb-cell-dropped" aria-hidden="true"><s>12</s>↓</span> dropped by drop lowest</li>
      <li><span className="wb-cell-sample wb-cell-above" aria-hidden="true">▲ 11</span> above points possible</li>
      <li className="wb-roster-keys">Enter or F2 edits · Escape cancels · Ctrl+Z undoes</li>
    </ul>
  );
}
