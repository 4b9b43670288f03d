/** The located problems of the current layout: where (sheet, row, column, value) and what to do. */
import type { ImportProblem } from '../../bridge/contract';

const SHOWN = 200;

export function ProblemList({ problems, checking }: { problems: readonly ImportProblem[]; checking: boolean }) {
  const errors = problems.filter((p) => p.severity === 'error').length;
  const warnings = problems.length - errors;
  return (
    <section className="wb-import-problems" aria-labelledby="wb-problems-title" aria-busy={checking}>
      <h3 id="wb-problems-title">
        Problems{' '}
        <span className="wb-problem-counts" aria-live="polite">
          {checking ? 'checking…' : problems.length === 0 ? 'none' : `${errors} ${errors === 1 ? 'error' : 'errors'}, ${warnings} ${warnings === 1 ? 'warning' : 'warnings'}`}
        </span>
      </h3>
      {problems.length > 0 && (
        <div className="wb-problems-scroll" role="region" aria-label="Problem list" tabIndex={0}>
          <table className="wb-problems">
            <thead>
              <tr>
                <th scope="col">Kind</th>
                <th scope="col">Sheet</th>
                <th scope="col">Row</th>
                <th scope="col">Column</th>
                <th scope="col">Value</th>
                <th scope="col">What to do</th>
              </tr>
            </thead>
            <tbody>
              {problems.slice(0, SHOWN).map((p, i) => (
                <tr key={i} className={`wb-problem-${p.severity}`}>
                  <td><span className={`wb-badge wb-badge-${p.severity}`}>{p.severity === 'error' ? 'Error' : 'Warning'}</span></td>
                  <td>{p.at?.sheet ?? ''}</td>
                  <td>{p.at?.row ?? ''}</td>
                  <td>{p.at?.column ?? ''}{p.at?.header !== undefined ? ` (${p.at.header})` : ''}</td>
                  <td className="wb-mono">{p.at?.value ?? ''}</td>
                  <td>{p.message}</td>
                </tr>
              ))}
            </tbody>
          </table>
          {problems.length > SHOWN && <p className="wb-hint">…and {problems.length - SHOWN} more of the same kinds.</p>}
        </div>
      )}
    </section>
  );
}
