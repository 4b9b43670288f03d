/** Per-assessment item analysis: difficulty, spread, counts, discrimination and flags. */
import type { ItemAnalysis } from '../../engine/analysis/itemAnalysis';
import { fmt } from './format';

export function ItemAnalysisTable({ rows, categoryName }: { rows: readonly ItemAnalysis[]; categoryName: (id: string | null) => string }) {
  const flagged = rows.filter((r) => r.flags.length > 0).length;
  return (
    <>
      <p className="wb-hint">
        Discrimination is the corrected item–total correlation: Pearson's r between the item percent and the
        rest of the mark — the weighted percent recomputed by the same plan without this item, before section
        adjustments. Only earned scores enter; missing, excused and pending cells are counted beside it. {flagged} of {rows.length} assessments are flagged.
      </p>
      <div className="wb-stats-scroll">
        <table className="wb-data-table wb-items" data-testid="item-analysis">
          <caption>Item analysis per assessment</caption>
          <thead>
            <tr>
              <th scope="col">Assessment</th><th scope="col">Category</th><th scope="col">Scored</th><th scope="col">Missing</th><th scope="col">Excused</th><th scope="col">Pending</th>
              <th scope="col">Mean % (difficulty)</th><th scope="col">Sample SD (%)</th><th scope="col">Discrimination r</th><th scope="col">Flags</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.assessmentId} data-assessment={r.assessmentId} data-flags={r.flags.map((f) => f.code).join(' ')}>
                <th scope="row">{r.name}{r.extraCredit ? ' (extra credit)' : ''}</th>
                <td>{categoryName(r.categoryId)}</td>
                <td className="wb-num">{r.scored}</td>
                <td className="wb-num">{r.missing}</td>
                <td className="wb-num">{r.excused}</td>
                <td className="wb-num">{r.pending}</td>
                <td className="wb-num">{r.meanPercent.defined ? fmt(r.meanPercent.value, 1) : 'not defined'}</td>
                <td className="wb-num">{r.sdPercent.defined ? fmt(r.sdPercent.value, 1) : 'not defined'}</td>
                <td className="wb-num" data-value={r.discrimination.defined ? r.discrimination.value : undefined}>
                  {r.discrimination.defined ? fmt(r.discrimination.value) : `not defined: ${r.discrimination.reason}`}
                </td>
                <td>{r.flags.length === 0 ? '—' : <ul>{r.flags.map((f) => <li key={f.code}>{f.message}</li>)}</ul>}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </>
  );
}
