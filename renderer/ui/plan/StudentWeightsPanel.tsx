/** The effective weights one chosen student gets, straight from the engine's result. */
import type { Gradebook, GradingPlan } from '../../engine/model';
import type { StudentResult } from '../../engine/results';
import { CATEGORY_STATUS_WORDS, categoryLines, formatPercent, formatShare } from '../results/resultsAccess';
import { Panel } from './fields';
import { StudentPicker } from './StudentPicker';


export function StudentWeightsPanel({ plan, gradebook, results, studentIndex, onStudent }: {
  plan: GradingPlan;
  gradebook: Gradebook;
  results: readonly StudentResult[];
  studentIndex: number | null;
  onStudent(index: number | null): void;
}) {
  const student = studentIndex === null ? undefined : gradebook.students[studentIndex];
  const result = studentIndex === null ? undefined : results[studentIndex];
  const name = (id: string) => plan.categories.find((c) => c.id === id)?.name ?? id;
  return (
    <Panel id="wb-plan-student" title="Weights for one student" description="Waivers and categories with nothing graded move weight to the categories that count.">
      <StudentPicker label="Student" students={gradebook.students} value={studentIndex} onChange={onStudent} />
      {student !== undefined && result !== undefined && (
        <>
          <p data-testid="plan-student-final">
            {student.name}, section {student.section}: final <strong data-final={result.final === null ? '' : String(result.final)}>{formatPercent(result.final, plan.rounding.decimals)}</strong>, letter <strong>{result.letter ?? 'none'}</strong>
          </p>
          <table className="wb-plan-table" data-testid="plan-student-weights">
            <caption className="wb-visually-hidden">Effective weights for {student.name}</caption>
            <thead><tr><th scope="col">Category</th><th scope="col" className="wb-num">Effective weight</th><th scope="col">Status</th></tr></thead>
            <tbody>
              {categoryLines(result).map((c) => (
                <tr key={c.categoryId} data-category-id={c.categoryId}>
                  <th scope="row">{name(c.categoryId)}</th>
                  <td className="wb-num" data-effective={String(result.effectiveWeights[c.categoryId] ?? 0)}>{formatShare(result.effectiveWeights[c.categoryId] ?? 0)}</td>
                  <td>{CATEGORY_STATUS_WORDS[c.status]}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </>
      )}
    </Panel>
  );
}
