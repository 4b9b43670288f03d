/**
 * Plan: how scores become a final mark — categories and weights, which assessment feeds which
 * category, waivers, grade scale, rounding, mark mode and section adjustments.
 *
 * Every change is one planEdits function sent to the course store as
 * `apply({ kind: 'updatePlan', label, plan })`, so it is undoable, autosaved, and the marks are
 * recomputed at once from the store's memoised results.
 */
import { useMemo, useState } from 'react';
import type { GradingPlan } from '../../engine/model';
import { useCourseStore } from '../../state/courseStore';
import { studentResultList } from '../results/resultsAccess';
import { AdjustmentsPanel } from './AdjustmentsPanel';
import { AssessmentsPanel } from './AssessmentsPanel';
import { CategoriesPanel } from './CategoriesPanel';
import { RoundingPanel, ScalePanel } from './ScalePanel';
import { StudentWeightsPanel } from './StudentWeightsPanel';
import { WaiversPanel } from './WaiversPanel';
import type { PlanUpdate } from './planUpdate';
import './plan.css';

export function PlanWorkspace() {
  const { project, results, apply } = useCourseStore();
  const [error, setError] = useState<string | null>(null);
  // Bumped when a change is refused, so every field shows the plan's value again, not the bad text.
  const [resetKey, setResetKey] = useState(0);
  const [studentIndex, setStudentIndex] = useState<number | null>(null);
  const plan = project?.plan;
  const gradebook = project?.gradebook;

  const sections = useMemo(
    () => [...new Set(gradebook?.students.map((s) => s.section) ?? [])].sort((a, b) => a.localeCompare(b, undefined, { numeric: true })),
    [gradebook],
  );

  const update = useMemo<PlanUpdate | null>(() => {
    if (plan === undefined) return null;
    const current: GradingPlan = plan;
    const fn = (label: string, change: (p: GradingPlan) => GradingPlan) => {
      try {
        const next = change(current);
        setError(null);
        if (next !== current) apply({ kind: 'updatePlan', label, plan: next });
      } catch (e) {
        // planEdits throws RangeError with a sentence for the user; anything else is a bug.
        if (!(e instanceof RangeError)) throw e;
        setError(e.message);
        setResetKey((k) => k + 1);
      }
    };
    return Object.assign(fn, { fail: (message: string) => setError(message) });
  }, [plan, apply]);

  if (project === null || plan === undefined || gradebook === undefined || update === null) {
    return (
      <section className="wb-plan" aria-labelledby="wb-plan-title">
        <h1 id="wb-plan-title">Plan</h1>
        <p>No course is open. Open a project or import a spreadsheet first.</p>
      </section>
    );
  }

  return (
    <section className="wb-plan" aria-labelledby="wb-plan-title">
      <header className="wb-plan-head">
        <h1 id="wb-plan-title">Plan</h1>
        <p className="wb-plan-description">Every change recomputes the marks at once and can be undone (Ctrl+Z).</p>
      </header>
      {error !== null && <p className="wb-plan-error" role="alert">Not changed: {error}</p>}
      <div className="wb-plan-body">
        <div className="wb-plan-main" key={resetKey}>
          <CategoriesPanel plan={plan} update={update} />
          <AssessmentsPanel plan={plan} gradebook={gradebook} update={update} />
          <WaiversPanel plan={plan} gradebook={gradebook} sections={sections} update={update} />
          <ScalePanel plan={plan} update={update} />
          <RoundingPanel plan={plan} update={update} />
          <AdjustmentsPanel plan={plan} sections={sections} update={update} />
        </div>
        <aside className="wb-plan-side" aria-label="Effects of the plan">
          <StudentWeightsPanel plan={plan} gradebook={gradebook} results={studentResultList(results)} studentIndex={studentIndex} onStudent={setStudentIndex} />
          {results !== null && results.planProblems.length > 0 && (
            <section className="wb-plan-panel" aria-labelledby="wb-plan-notes-title">
              <h2 id="wb-plan-notes-title">Notes about this plan</h2>
              <ul className="wb-plan-notes">{results.planProblems.map((p) => <li key={p}>{p}</li>)}</ul>
            </section>
          )}
        </aside>
      </div>
    </section>
  );
}
