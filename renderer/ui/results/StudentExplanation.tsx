/**
 * One student's mark, line by line, in the engine's own sentences (describeLine), grouped by
 * category, with the effective weights they get and what they need on work still pending.
 */
import { useMemo } from 'react';
import type { CourseProject } from '../../bridge/contract';
import type { ExplanationLine, StudentResult } from '../../engine/results';
import { describeLine, type LineNames } from '../../engine/grading/explain';
import { neededOnPending } from '../../engine/grading/whatIf';
import { projectedWeighted } from '../../engine/fast/projectedWeighted';
import type { Gradebook, GradingPlan } from '../../engine/model';
import { CATEGORY_STATUS_WORDS, categoryLines, formatPercent, formatShare, itemLines } from './resultsAccess';


/** Every student's projected weighted percent, once per (gradebook, plan) however many students are shown. */
const projectedCache = new WeakMap<Gradebook, WeakMap<GradingPlan, readonly (number | null)[]>>();
function othersWeighted(book: Gradebook, plan: GradingPlan): readonly (number | null)[] {
  let byPlan = projectedCache.get(book);
  if (byPlan === undefined) projectedCache.set(book, (byPlan = new WeakMap()));
  let values = byPlan.get(plan);
  if (values === undefined) byPlan.set(plan, (values = projectedWeighted(book, plan)));
  return values;
}

export function lineNames(project: CourseProject): LineNames {
  const categories = new Map(project.plan.categories.map((c) => [c.id, c.name]));
  const assessments = new Map(project.gradebook.assessments.map((a) => [a.id, a.name]));
  return {
    category: (id) => categories.get(id) ?? id,
    assessment: (id) => assessments.get(id) ?? id,
  };
}

export interface StudentExplanationProps {
  project: CourseProject;
  result: StudentResult | undefined;
  studentIndex: number;
}

export function StudentExplanation({ project, result, studentIndex }: StudentExplanationProps) {
  const student = project.gradebook.students[studentIndex];
  const names = useMemo(() => lineNames(project), [project]);
  const needed = useMemo(
    () => neededOnPending(project.gradebook, project.plan, studentIndex, othersWeighted(project.gradebook, project.plan)),
    [project.gradebook, project.plan, studentIndex],
  );
  if (student === undefined || result === undefined) return null;
  const decimals = project.plan.rounding.decimals;
  const cats = categoryLines(result);
  const overall = result.lines.filter((l): l is Exclude<ExplanationLine, { kind: 'item' } | { kind: 'category' }> => l.kind !== 'item' && l.kind !== 'category');

  return (
    <article className="wb-explanation" aria-labelledby="wb-explanation-title">
      <h2 id="wb-explanation-title">{student.name} <span className="wb-mono wb-muted">{student.id}</span></h2>
      <p className="wb-explanation-summary">
        Section {student.section} · final <strong data-testid="explanation-final" data-final={result.final === null ? '' : String(result.final)}>{formatPercent(result.final, decimals)}</strong>
        {' · '}letter <strong>{result.letter ?? 'none'}</strong>
        {result.gradePoints !== null && <> · {result.gradePoints} grade points</>}
        {' · '}{project.plan.markMode === 'current' ? 'current mark (ungraded work left out)' : 'projected final (ungraded work counts as zero)'}
      </p>

      <h3>Effective weights</h3>
      <table className="wb-weights" data-testid="explanation-weights">
        <caption className="wb-visually-hidden">Category weights for {student.name}</caption>
        <thead>
          <tr><th scope="col">Category</th><th scope="col" className="wb-num">Plan weight</th><th scope="col" className="wb-num">Effective weight</th><th scope="col">Status</th></tr>
        </thead>
        <tbody>
          {cats.map((c) => (
            <tr key={c.categoryId} data-category-id={c.categoryId}>
              <th scope="row">{names.category(c.categoryId)}</th>
              <td className="wb-num">{formatShare(c.nominalWeight).replace(' %', '')}</td>
              <td className="wb-num" data-effective={String(result.effectiveWeights[c.categoryId] ?? 0)}>{formatShare(result.effectiveWeights[c.categoryId] ?? 0)}</td>
              <td>{CATEGORY_STATUS_WORDS[c.status]}</td>
            </tr>
          ))}
        </tbody>
      </table>

      <h3>How the mark is made</h3>
      {cats.map((c) => (
        <section key={c.categoryId} className="wb-explain-category" aria-label={names.category(c.categoryId)}>
          <h4>{names.category(c.categoryId)} <span className="wb-muted">({formatShare(c.effectiveWeight)} of the mark)</span></h4>
          <ul>
            {itemLines(result, c.categoryId).map((l) => (
              <li key={l.assessmentId} data-status={l.status} className={`wb-line-${l.status}`}>{describeLine(l, names)}</li>
            ))}
          </ul>
          <p className="wb-category-sentence">{describeLine(c, names)}</p>
        </section>
      ))}
      <ol className="wb-overall-lines">
        {overall.map((l, i) => <li key={i}>{describeLine(l, names)}</li>)}
      </ol>

      <h3>What if: pending work</h3>
      <WhatIf needed={needed} />
    </article>
  );
}

function WhatIf({ needed }: { needed: ReturnType<typeof neededOnPending> }) {
  if (needed.length === 0) return <p>The grade scale has no cutoffs.</p>;
  if (needed.every((n) => n.status === 'reached' || n.status === 'noPendingWork')) {
    const best = needed.find((n) => n.status === 'reached');
    return (
      <p>
        Nothing is pending for this student that would change the letter
        {best !== undefined ? `; the projected final already reaches ${best.letter}.` : '.'}
      </p>
    );
  }
  // Cutoffs ordered highest first: the open goals, then the best letter already secured.
  const open = needed.filter((n) => n.status === 'reachable' || n.status === 'unreachable');
  const secured = needed.find((n) => n.status === 'reached');
  return (
    <ul className="wb-whatif" data-testid="whatif">
      {open.map((n) => (
        <li key={n.letter}>
          {n.status === 'reachable' && n.neededPercent.defined
            ? `Needs ${n.neededPercent.value} % on remaining work for ${n.letter} (${n.minPercent} %).`
            : `${n.letter} (${n.minPercent} %) is out of reach: ${n.neededPercent.defined ? '' : n.neededPercent.reason}.`}
        </li>
      ))}
      {secured !== undefined && <li>{secured.letter} is secured even with 0 % on the remaining work.</li>}
    </ul>
  );
}
