/** Section comparison in plain words, the pairwise figures, and the standing caution. */
import type { SectionComparison } from '../../engine/analysis/compareSections';
import { effectWords, formatP } from '../../engine/analysis/compareSections';
import { fmt } from './format';
import { LazyDetails } from './LazyDetails';

export function ComparisonPanel({ comparison, label }: { comparison: SectionComparison; label: string }) {
  return (
    <div className="wb-comparison" data-testid="comparison">
      <p className="wb-caution" role="note">{comparison.caution}</p>
      {comparison.sentences.map((s) => <p key={s}>{s}</p>)}
      {comparison.pairs.length > 0 && (
        <>
          <table className="wb-data-table">
            <caption>Pairwise comparison of {label}: Mann–Whitney U (two-sided) and Hedges' g</caption>
            <thead>
              <tr><th scope="col">Sections</th><th scope="col">n</th><th scope="col">Mean difference</th><th scope="col">U</th><th scope="col">p</th><th scope="col">Hedges' g</th><th scope="col">Size</th></tr>
            </thead>
            <tbody>
              {comparison.pairs.map((p) => (
                <tr key={`${p.a}|${p.b}`}>
                  <th scope="row">{p.a} vs {p.b}</th>
                  <td>{p.nA} / {p.nB}</td>
                  <td>{p.meanA.defined && p.meanB.defined ? fmt(p.meanA.value - p.meanB.value) : 'not defined'}</td>
                  <td>{p.mannWhitney.defined ? fmt(p.mannWhitney.value.u, 1) : 'not defined'}</td>
                  <td>{p.mannWhitney.defined ? `${formatP(p.mannWhitney.value.p)}${p.mannWhitney.value.method === 'exact' ? ' (exact)' : ''}` : p.mannWhitney.reason}</td>
                  <td>{p.hedges.defined ? fmt(p.hedges.value.g) : p.hedges.reason}</td>
                  <td>{p.hedges.defined ? effectWords(p.hedges.value.g) : '—'}</td>
                </tr>
              ))}
            </tbody>
          </table>
          <LazyDetails summary="The same, in sentences">
            {() => <ul>{comparison.pairs.map((p) => <li key={`${p.a}|${p.b}`}>{p.sentence}</li>)}</ul>}
          </LazyDetails>
        </>
      )}
    </div>
  );
}
