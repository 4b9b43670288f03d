/**
 * The four distribution charts of the Sections workspace, each with its text alternative: box
 * plots per section, a histogram with a bin-rule choice and the cutoffs, the ECDF overlay with a
 * movable mark, and the letter-grade distribution.
 */
import { useCallback, useId, useMemo, useState } from 'react';
import type { SectionStatistics } from '../../engine/analysis/sectionStatistics';
import { ecdfAt } from '../../engine/stats/ecdf';
import type { BinRule } from '../../engine/stats/histogram';
import type { GradeCutoff } from '../../engine/model';
import { NumberField } from '../common/NumberField';
import { ChartFigure } from './ChartFigure';
import { boxData, ecdfData, histogramData, type LetterDistribution } from './chartData';
import { boxPlotChart, ecdfChart, histogramChart, letterChart, sectionColors } from './charts';
import { fmt } from './format';

export type BinRuleKind = BinRule['kind'];

export const BIN_RULE_NAMES: Record<BinRuleKind, string> = {
  sturges: 'Sturges (number of classes ⌈log₂ n + 1⌉)',
  scott: 'Scott (width 3.49·s·n^−⅓)',
  freedmanDiaconis: 'Freedman–Diaconis (width 2·IQR·n^−⅓)',
  fixed: 'Fixed width',
};

function Legend({ sections }: { sections: readonly string[] }) {
  // By the names, not the array (a new one each render): the colours need a Plot scale.
  const key = JSON.stringify(sections);
  const colors = useMemo(() => sectionColors(document, JSON.parse(key) as string[]), [key]);
  return (
    <ul className="wb-legend" aria-label="Section colours">
      {sections.map((s) => (
        <li key={s}>
          <svg width="12" height="12" aria-hidden="true" focusable="false"><rect width="12" height="12" fill={colors.get(s)} /></svg>
          {s}
        </li>
      ))}
    </ul>
  );
}

export function BoxPlotFigure({ stats }: { stats: SectionStatistics }) {
  const boxes = useMemo(() => boxData(stats), [stats]);
  const build = useCallback((doc: Document) => (boxes.length === 0 ? null : boxPlotChart(doc, boxes, stats.label)), [boxes, stats.label]);
  const readouts = boxes.map(
    (b) => `Section ${b.section}, n = ${b.n}: lower whisker ${fmt(b.whiskerLow)}, Q1 ${fmt(b.q1)}, median ${fmt(b.median)}, Q3 ${fmt(b.q3)}, upper whisker ${fmt(b.whiskerHigh)}; ${b.outliers.length === 0 ? 'no outliers' : `outliers ${b.outliers.map((o) => `${o.label} ${fmt(o.value)}`).join(', ')}`}.`,
  );
  return (
    <ChartFigure
      chart="boxplot"
      title={`Box plots per section (${stats.course.quantileMethod})`}
      build={build}
      readoutCount={readouts.length}
      readout={(i) => readouts[i] ?? ''}
      table={() => (
        <table className="wb-data-table">
          <caption>Box plot numbers per section</caption>
          <thead><tr><th scope="col">Section</th><th scope="col">n</th><th scope="col">Lower whisker</th><th scope="col">Q1</th><th scope="col">Median</th><th scope="col">Q3</th><th scope="col">Upper whisker</th><th scope="col">Outliers</th></tr></thead>
          <tbody>
            {boxes.map((b) => (
              <tr key={b.section}>
                <th scope="row">{b.section}</th><td>{b.n}</td><td>{fmt(b.whiskerLow)}</td><td>{fmt(b.q1)}</td><td>{fmt(b.median)}</td><td>{fmt(b.q3)}</td><td>{fmt(b.whiskerHigh)}</td>
                <td>{b.outliers.length === 0 ? 'none' : b.outliers.map((o) => `${o.label} (${fmt(o.value)})`).join('; ')}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    >
      <Legend sections={boxes.map((b) => b.section)} />
    </ChartFigure>
  );
}

export function HistogramFigure({ stats, cutoffs }: { stats: SectionStatistics; cutoffs: readonly GradeCutoff[] | null }) {
  const [kind, setKind] = useState<BinRuleKind>('sturges');
  const [width, setWidth] = useState(5);
  const [group, setGroup] = useState<string>('');
  const selectId = useId();
  const groupId = useId();
  const values = group === '' ? stats.courseValues : (stats.sections.find((s) => s.section === group)?.values ?? []);
  const hist = useMemo(() => histogramData(values, kind === 'fixed' ? { kind, width } : { kind }), [values, kind, width]);
  const lines = useMemo(() => (cutoffs ?? []).map((c) => ({ letter: c.letter, minPercent: c.minPercent })), [cutoffs]);
  const build = useCallback((doc: Document) => (hist.defined ? histogramChart(doc, hist.value.bins, lines, stats.label) : null), [hist, lines, stats.label]);
  const bins = hist.defined ? hist.value.bins : [];
  return (
    <ChartFigure
      chart="histogram"
      title={`Histogram of ${stats.label}`}
      build={build}
      readoutCount={bins.length}
      readout={(i) => {
        const b = bins[i]!;
        return `${fmt(b.lower)} to ${fmt(b.upper)}: ${b.count} student${b.count === 1 ? '' : 's'}.`;
      }}
      table={() => (
        <table className="wb-data-table">
          <caption>Histogram bins ({hist.defined ? hist.value.rule : 'none'}); each bin includes its lower edge, the last also its upper edge</caption>
          <thead><tr><th scope="col">From</th><th scope="col">To</th><th scope="col">Students</th></tr></thead>
          <tbody>{bins.map((b, i) => <tr key={i}><td>{fmt(b.lower)}</td><td>{fmt(b.upper)}</td><td>{b.count}</td></tr>)}</tbody>
        </table>
      )}
    >
      <div className="wb-chart-controls">
        <label htmlFor={groupId}>Group</label>
        <select id={groupId} value={group} onChange={(e) => setGroup(e.target.value)}>
          <option value="">Whole course</option>
          {stats.sections.map((s) => <option key={s.section} value={s.section}>Section {s.section}</option>)}
        </select>
        <label htmlFor={selectId}>Bin rule</label>
        <select id={selectId} value={kind} onChange={(e) => setKind(e.target.value as BinRuleKind)} data-testid="bin-rule">
          {(Object.keys(BIN_RULE_NAMES) as BinRuleKind[]).map((k) => <option key={k} value={k}>{BIN_RULE_NAMES[k]}</option>)}
        </select>
        {kind === 'fixed' && <NumberField label="Bin width" value={width} min={0.01} step="any" onCommit={(v) => v !== null && setWidth(v)} />}
      </div>
      <p className="wb-hint" data-testid="histogram-rule">
        {hist.defined ? `${hist.value.rule}; ${bins.length} bins.` : `No histogram: ${hist.reason}.`}
        {cutoffs !== null && cutoffs.length > 0 ? ' Dashed lines: the grade cutoffs.' : ''}
      </p>
    </ChartFigure>
  );
}

export function EcdfFigure({ stats }: { stats: SectionStatistics }) {
  const series = useMemo(() => ecdfData(stats), [stats]);
  const steps = useMemo(() => series.flatMap((s) => s.steps.map((step) => ({ section: s.section, step }))), [series]);
  const all = stats.courseValues;
  const lo = all.length > 0 ? Math.floor(Math.min(...all)) : 0;
  const hi = all.length > 0 ? Math.ceil(Math.max(...all)) : 100;
  const [at, setAt] = useState<number | null>(null);
  const mark = at === null ? Math.round((lo + hi) / 2) : Math.min(hi, Math.max(lo, at));
  const sliderId = useId();
  const build = useCallback((doc: Document) => (series.length === 0 ? null : ecdfChart(doc, series, mark, stats.label)), [series, mark, stats.label]);
  // Sorted once per statistics, not on every move of the mark.
  const sortedSections = useMemo(
    () => stats.sections.filter((s) => s.values.length > 0).map((s) => ({ section: s.section, sorted: [...s.values].sort((a, b) => a - b) })),
    [stats],
  );
  const shares = sortedSections.map(({ section, sorted }) => ({ section, share: ecdfAt(sorted, mark), n: sorted.length }));
  return (
    <ChartFigure
      chart="ecdf"
      title={`Cumulative share per section (ECDF) of ${stats.label}`}
      build={build}
      readoutCount={steps.length}
      readout={(i) => {
        const { section, step } = steps[i]!;
        return `Section ${section}: ${fmt(step.p * 100, 1)} % at or below ${fmt(step.x)}.`;
      }}
      table={() => (
        <table className="wb-data-table">
          <caption>ECDF steps per section: share of students at or below each value</caption>
          <thead><tr><th scope="col">Section</th><th scope="col">Value</th><th scope="col">Share at or below</th></tr></thead>
          <tbody>
            {series.flatMap((s) => s.steps.map((st) => (
              <tr key={`${s.section}-${st.x}`}><th scope="row">{s.section}</th><td>{fmt(st.x)}</td><td>{fmt(st.p * 100, 1)} %</td></tr>
            )))}
          </tbody>
        </table>
      )}
    >
      <Legend sections={series.map((s) => s.section)} />
      <div className="wb-chart-controls">
        <label htmlFor={sliderId}>Mark at</label>
        <input id={sliderId} type="range" min={lo} max={hi} step={0.5} value={mark} onChange={(e) => setAt(Number(e.target.value))} aria-valuetext={`${fmt(mark, 1)}`} />
        <output htmlFor={sliderId} className="wb-num">{fmt(mark, 1)}</output>
      </div>
      <ul className="wb-ecdf-shares" aria-live="polite" data-testid="ecdf-shares">
        {shares.map((s) => (
          <li key={s.section} data-section={s.section} data-share={s.share}>
            Section {s.section}: {fmt(s.share * 100, 1)} % of {s.n} at or below {fmt(mark, 1)}
          </li>
        ))}
      </ul>
    </ChartFigure>
  );
}

export function LetterFigure({ dist }: { dist: LetterDistribution }) {
  const build = useCallback(
    (doc: Document) => (dist.sections.length === 0 ? null : letterChart(doc, dist.data, dist.letters, dist.sections)),
    [dist],
  );
  const missing = dist.sections.filter((s) => (dist.noLetter[s] ?? 0) > 0);
  return (
    <ChartFigure
      chart="letters"
      title="Letter-grade distribution per section"
      build={build}
      readoutCount={dist.data.length}
      readout={(i) => {
        const d = dist.data[i]!;
        return `Section ${d.section}, ${d.letter}: ${d.count} (${fmt(d.share * 100, 1)} %).`;
      }}
      table={() => (
        <table className="wb-data-table">
          <caption>Students per letter and section (share of the section's students with a letter)</caption>
          <thead><tr><th scope="col">Letter</th>{dist.sections.map((s) => <th key={s} scope="col">{s}</th>)}</tr></thead>
          <tbody>
            {dist.letters.map((l) => (
              <tr key={l}>
                <th scope="row">{l}</th>
                {dist.sections.map((s) => {
                  const d = dist.data.find((x) => x.section === s && x.letter === l);
                  return <td key={s}>{d === undefined ? 0 : `${d.count} (${fmt(d.share * 100, 1)} %)`}</td>;
                })}
              </tr>
            ))}
            <tr><th scope="row">No letter</th>{dist.sections.map((s) => <td key={s}>{dist.noLetter[s] ?? 0}</td>)}</tr>
          </tbody>
        </table>
      )}
    >
      <p className="wb-hint">One row per section; a darker cell is a larger share of that section's students with a letter. The number in a cell is its count of students.</p>
      {missing.length > 0 && <p className="wb-hint">Students without a mark are not in the shares: {missing.map((s) => `${s}: ${dist.noLetter[s]}`).join(', ')}.</p>}
    </ChartFigure>
  );
}
