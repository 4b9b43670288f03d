/**
 * Results: every student's final mark (sortable, filterable, virtualised), one student's mark
 * explained line by line, what they need on pending work, and the students just below a cutoff.
 * All numbers come from the engine (store results, describeLine, neededOnPending, boundaryList);
 * this screen only arranges them.
 */
import { REVIEW_CAUTION } from '../app/caution';
import { useDeferredValue, useId, useMemo, useState } from 'react';
import { useCourseStore } from '../../state/courseStore';
import { sortedCutoffs } from '../../engine/grading/gradeScale';
import { boundaryList } from '../../engine/grading/whatIf';
import { NumberField } from '../common/NumberField';
import { FinalsTable, type SortKey, type SortState } from './FinalsTable';
import { StudentExplanation } from './StudentExplanation';
import { formatPercent, studentResultList } from './resultsAccess';
import './results.css';


const NO_LETTER = '\u0000none';

export function ResultsWorkspace() {
  const { project, results } = useCourseStore();
  const [section, setSection] = useState('');
  const [letter, setLetter] = useState('');
  const [search, setSearch] = useState('');
  const deferredSearch = useDeferredValue(search);
  const [sort, setSort] = useState<SortState>({ key: 'name', direction: 'ascending' });
  const [selected, setSelected] = useState<string | null>(null);
  const [within, setWithin] = useState(1);
  const ids = { section: useId(), letter: useId(), search: useId() };

  const gradebook = project?.gradebook;
  const plan = project?.plan;
  const list = useMemo(() => studentResultList(results), [results]);

  const sections = useMemo(
    () => [...new Set(gradebook?.students.map((s) => s.section) ?? [])].sort((a, b) => a.localeCompare(b, undefined, { numeric: true })),
    [gradebook],
  );
  const letterRank = useMemo(() => {
    const rank = new Map<string, number>();
    if (plan !== undefined) sortedCutoffs(plan.scale).forEach((c, i) => rank.set(c.letter, i));
    return rank;
  }, [plan]);

  const rows = useMemo(() => {
    if (gradebook === undefined) return [];
    const needle = deferredSearch.trim().toLowerCase();
    const out: number[] = [];
    gradebook.students.forEach((s, i) => {
      const r = list[i];
      if (r === undefined) return;
      if (section !== '' && s.section !== section) return;
      if (letter === NO_LETTER ? r.letter !== null : letter !== '' && r.letter !== letter) return;
      if (needle !== '' && !s.name.toLowerCase().includes(needle) && !s.id.toLowerCase().includes(needle)) return;
      out.push(i);
    });
    const sign = sort.direction === 'ascending' ? 1 : -1;
    const nullLast = (a: number | null | undefined, b: number | null | undefined) => {
      if (a == null && b == null) return 0;
      if (a == null) return 1;
      if (b == null) return -1;
      return sign * (a - b);
    };
    const text = (a: string, b: string) => sign * a.localeCompare(b, undefined, { numeric: true, sensitivity: 'base' });
    const cmp: Record<SortKey, (a: number, b: number) => number> = {
      id: (a, b) => text(gradebook.students[a]?.id ?? '', gradebook.students[b]?.id ?? ''),
      name: (a, b) => text(gradebook.students[a]?.name ?? '', gradebook.students[b]?.name ?? ''),
      section: (a, b) => text(gradebook.students[a]?.section ?? '', gradebook.students[b]?.section ?? ''),
      final: (a, b) => nullLast(list[a]?.final, list[b]?.final),
      // Best letter first when descending: rank 0 is the highest cutoff.
      letter: (a, b) => nullLast(rankOf(list[b]?.letter), rankOf(list[a]?.letter)),
      gradePoints: (a, b) => nullLast(list[a]?.gradePoints, list[b]?.gradePoints),
    };
    function rankOf(l: string | null | undefined): number | null {
      return l == null ? null : (letterRank.get(l) ?? null);
    }
    const compare = cmp[sort.key];
    return out.sort((a, b) => compare(a, b) || a - b);
  }, [gradebook, list, section, letter, deferredSearch, sort, letterRank]);

  const boundary = useMemo(
    () => (plan === undefined ? [] : boundaryList(list, plan.scale, within)),
    [list, plan, within],
  );

  if (project === null || gradebook === undefined || plan === undefined || results === null) {
    return (
      <section className="wb-results" aria-labelledby="wb-results-title">
        <h1 id="wb-results-title">Results</h1>
        <p>No course is open. Open a project or import a spreadsheet first.</p>
      </section>
    );
  }

  const indexById = new Map(gradebook.students.map((s, i) => [s.id, i] as const));
  const selectedIndex = selected === null ? undefined : indexById.get(selected);
  const letters = sortedCutoffs(plan.scale).map((c) => c.letter);

  return (
    <section className="wb-results" aria-labelledby="wb-results-title">
      <header className="wb-results-head">
        <h1 id="wb-results-title">Results</h1>
        <p className="wb-caution" role="note">{REVIEW_CAUTION}</p>
      </header>
      {results.planProblems.length > 0 && (
        <details className="wb-plan-problems">
          <summary>{results.planProblems.length} note{results.planProblems.length === 1 ? '' : 's'} about the plan</summary>
          <ul>{results.planProblems.map((p) => <li key={p}>{p}</li>)}</ul>
        </details>
      )}
      <div className="wb-results-body">
        <div className="wb-results-main">
          <div className="wb-results-filters" role="search" aria-label="Filter final marks">
            <label htmlFor={ids.section}>Section</label>
            <select id={ids.section} value={section} onChange={(e) => setSection(e.target.value)}>
              <option value="">All sections</option>
              {sections.map((s) => <option key={s} value={s}>{s}</option>)}
            </select>
            <label htmlFor={ids.letter}>Letter</label>
            <select id={ids.letter} value={letter} onChange={(e) => setLetter(e.target.value)}>
              <option value="">All letters</option>
              {letters.map((l) => <option key={l} value={l}>{l}</option>)}
              <option value={NO_LETTER}>No letter</option>
            </select>
            <label htmlFor={ids.search}>Find student</label>
            <input id={ids.search} type="search" placeholder="Name or ID" value={search} onChange={(e) => setSearch(e.target.value)} />
            <span className="wb-results-count" aria-live="polite">{rows.length} of {gradebook.students.length} students</span>
          </div>
          <FinalsTable
            gradebook={gradebook}
            results={list}
            rows={rows}
            decimals={plan.rounding.decimals}
            sort={sort}
            onSort={setSort}
            selectedId={selected}
            onSelect={setSelected}
          />
          <section className="wb-boundary" aria-labelledby="wb-boundary-title">
            <h2 id="wb-boundary-title">Just below a cutoff</h2>
            <NumberField label="Within (points)" value={within} min={0} max={100} onCommit={(v) => setWithin(v ?? 1)} />
            {boundary.length === 0 ? (
              <p>No student is within {within} point{within === 1 ? '' : 's'} below the next cutoff.</p>
            ) : (
              <table className="wb-boundary-table">
                <caption className="wb-visually-hidden">Students within {within} points below the next cutoff, closest first</caption>
                <thead>
                  <tr><th scope="col">Student</th><th scope="col">Section</th><th scope="col">Final</th><th scope="col">Letter</th><th scope="col">Next cutoff</th><th scope="col">Short by</th></tr>
                </thead>
                <tbody>
                  {boundary.map((b) => {
                    const i = indexById.get(b.studentId);
                    const s = i === undefined ? undefined : gradebook.students[i];
                    return (
                      <tr key={b.studentId}>
                        <td><button type="button" className="wb-link-button" onClick={() => setSelected(b.studentId)}>{s?.name ?? b.studentId}</button></td>
                        <td>{b.section}</td>
                        <td className="wb-num">{formatPercent(b.final, plan.rounding.decimals)}</td>
                        <td>{b.letter ?? '—'}</td>
                        <td>{b.nextLetter} at {b.nextMin} %</td>
                        <td className="wb-num">{b.gap}</td>
                      </tr>
                    );
                  })}
                </tbody>
              </table>
            )}
          </section>
        </div>
        <aside className="wb-results-detail" aria-label="Selected student" tabIndex={0}>
          {selectedIndex === undefined ? (
            <p className="wb-results-hint">Choose a student in the list to see how their mark is made.</p>
          ) : (
            <StudentExplanation project={project} result={list[selectedIndex]} studentIndex={selectedIndex} />
          )}
        </aside>
      </div>
    </section>
  );
}
