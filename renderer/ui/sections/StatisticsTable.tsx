/**
 * Statistics per section and for the whole course: one column per group, one row per statistic.
 * Each number cell carries data-stat / data-section / data-value (the engine's unrounded value)
 * so tests compare the screen with the engine exactly; a statistic that is not defined shows why.
 */
import { describeLeftOut, type LeftOutCount } from '../../engine/analysis/measure';
import type { SectionStatistics } from '../../engine/analysis/sectionStatistics';
import type { Summary } from '../../engine/stats/describe';
import { fmt } from './format';
import { statRows, statValue } from './statRows';

export const COURSE_KEY = '__course__';

interface Column {
  readonly key: string;
  readonly label: string;
  readonly summary: Summary;
  readonly leftOut: readonly LeftOutCount[];
}

export function StatisticsTable({ stats, captionId }: { stats: SectionStatistics; captionId: string }) {
  const columns: Column[] = [
    { key: COURSE_KEY, label: 'Whole course', summary: stats.course, leftOut: stats.leftOut },
    ...stats.sections.map((s) => ({ key: s.section, label: `Section ${s.section}`, summary: s.summary, leftOut: s.leftOut })),
  ];
  const rows = statRows(stats.course.quantileMethod);
  return (
    <div className="wb-stats-scroll">
      <table className="wb-stats" aria-labelledby={captionId} data-testid="section-statistics">
        <thead>
          <tr>
            <th scope="col">Statistic</th>
            {columns.map((c) => <th key={c.key} scope="col" className="wb-num">{c.label}</th>)}
          </tr>
        </thead>
        <tbody>
          <tr>
            <th scope="row">n (students with a value)</th>
            {columns.map((c) => (
              <td key={c.key} className="wb-num" data-stat="n" data-section={c.key} data-value={c.summary.n}>{c.summary.n}</td>
            ))}
          </tr>
          <tr>
            <th scope="row">Left out</th>
            {columns.map((c) => (
              <td key={c.key} className="wb-left-out" data-stat="leftOut" data-section={c.key}>{describeLeftOut(c.leftOut) || 'none'}</td>
            ))}
          </tr>
          {rows.map((r) => (
            <tr key={r.key}>
              <th scope="row">{r.label}</th>
              {columns.map((c) => {
                const d = statValue(c.summary, r.key);
                return d.defined ? (
                  <td key={c.key} className="wb-num" data-stat={r.key} data-section={c.key} data-value={d.value}>
                    {r.asPercent === true ? `${fmt(d.value * 100, 1)} %` : fmt(d.value)}
                  </td>
                ) : (
                  <td key={c.key} className="wb-nd" data-stat={r.key} data-section={c.key} data-defined="false">
                    not defined: {d.reason}
                  </td>
                );
              })}
            </tr>
          ))}
          <tr>
            <th scope="row">Mode(s)</th>
            {columns.map((c) => (
              <td key={c.key} className="wb-num" data-stat="modes" data-section={c.key}>
                {c.summary.modes.defined ? c.summary.modes.value.map((m) => fmt(m)).join(', ') : `not defined: ${c.summary.modes.reason}`}
              </td>
            ))}
          </tr>
          <tr>
            <th scope="row">Outliers (strictly beyond a fence)</th>
            {columns.map((c) => (
              <td key={c.key} className="wb-outliers" data-stat="outliers" data-section={c.key} data-count={c.summary.outliers.length}>
                {c.summary.outliers.length === 0 ? (
                  'none'
                ) : (
                  <ul>
                    {c.summary.outliers.map((o) => (
                      <li key={`${o.index}`} data-outlier={o.label} data-value={o.value}>
                        {o.label}: {fmt(o.value)} ({o.side === 'low' ? 'below' : 'above'})
                      </li>
                    ))}
                  </ul>
                )}
              </td>
            ))}
          </tr>
        </tbody>
      </table>
    </div>
  );
}
