/**
 * Sections: do the marks make sense, and are sections taught or marked by different people
 * consistent? Statistics per section and for the course on any measure, four distribution
 * charts, the comparison in plain words, and the per-assessment item analysis. Also where marks
 * leave the app: the export dialog and the printable report.
 *
 * The statistics table is in the first paint, and so are the charts when they are on screen then
 * (in a window of ordinary height they are below the table and follow just after that paint,
 * one chart per slice: drawSoon.ts). The comparison (a test for every
 * pair of sections) and the item analysis (a rest mark per assessment) take far longer on a large
 * course, so they are computed after that paint, in slices (useAfterPaint), with a polite
 * "computing" status in their place meanwhile.
 *
 * Every number is the engine's (analysis/, stats/); this screen arranges and labels them.
 */
import { useId, useLayoutEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import { comparisonSteps } from '../../engine/analysis/compareSections';
import { itemAnalysisSteps } from '../../engine/analysis/itemAnalysis';
import type { Measure } from '../../engine/analysis/measure';
import { sectionStatistics, type SectionStatistics } from '../../engine/analysis/sectionStatistics';
import type { Gradebook, GradeScale } from '../../engine/model';
import type { StudentResult } from '../../engine/results';
import { finalMarkStatistics } from '../../engine/fast/finalMarkStatistics';
import { sortedCutoffs } from '../../engine/grading/gradeScale';
import { QUANTILE_METHODS, QUANTILE_TYPES, type QuantileType } from '../../engine/stats/quantile';
import { useCourseStore } from '../../state/courseStore';
import { Button } from '../common/Button';
import { ReportPreview } from '../report/ReportPreview';
import { letterDistribution } from './chartData';
import { ChartsBuiltLate } from './ChartFigure';
import { ComparisonPanel } from './ComparisonPanel';
import { drawSoon, inViewport } from './drawSoon';
import { ItemAnalysisTable } from './ItemAnalysisTable';
import { BoxPlotFigure, EcdfFigure, HistogramFigure, LetterFigure } from './SectionCharts';
import { StatisticsTable } from './StatisticsTable';
import { useAfterPaint } from './useAfterPaint';
import './sections.css';

/** Select value ⇄ measure: "final", "cat:<id>", "asm:<id>". */
export function measureFromValue(value: string): Measure {
  if (value.startsWith('cat:')) return { kind: 'category', categoryId: value.slice(4) };
  if (value.startsWith('asm:')) return { kind: 'assessment', assessmentId: value.slice(4) };
  return { kind: 'final' };
}

export function SectionsWorkspace() {
  const { project, results } = useCourseStore();
  const [measureValue, setMeasureValue] = useState('final');
  const [quantileType, setQuantileType] = useState<QuantileType>(7);
  const [dialog, setDialog] = useState<'none' | 'report'>('none');
  const ids = { measure: useId(), quantile: useId(), stats: useId(), title: useId() };

  const book = project?.gradebook;
  const plan = project?.plan;
  const students = results?.students;

  // A measure whose assessment/category vanished (re-import, plan edit) falls back to final marks.
  const measure = useMemo<Measure>(() => {
    const m = measureFromValue(measureValue);
    if (m.kind === 'assessment' && !book?.assessments.some((a) => a.id === m.assessmentId)) return { kind: 'final' };
    if (m.kind === 'category' && !plan?.categories.some((c) => c.id === m.categoryId)) return { kind: 'final' };
    return m;
  }, [measureValue, book, plan]);

  const stats = useMemo(() => {
    if (book === undefined || students === undefined || results === null) return null;
    // Kept per course result (replaced on every gradebook or plan change), so coming back to
    // Sections without a change does not compute the same statistics again.
    return remembered(results, `${quantileType}|${measureKey(measure)}`, () => {
      // Final marks (the default view) on the fast path: each section sorted once, on the rounding
      // grid (any decimals give the same numbers; the plan's make it a counting sort).
      const s =
        measure.kind === 'final'
          ? finalMarkStatistics(book, students, quantileType, plan?.rounding.decimals)
          : sectionStatistics(book, students, { quantileType, measure });
      if (measure.kind !== 'category') return s;
      const name = plan?.categories.find((c) => c.id === measure.categoryId)?.name ?? measure.categoryId;
      return { ...s, label: `${name} (category %)` };
    });
  }, [book, students, results, quantileType, measure, plan]);

  // Both depend on the course result (replaced on every gradebook or plan change) and, for the
  // comparison, on the measure's values; neither on the quartile method. The step functions run
  // only while the owner is not null, that is while stats, book and plan exist.
  const comparison = useAfterPaint(stats === null ? null : results, `comparison of ${measureKey(measure)}`, () =>
    comparisonSteps(stats!.sections.filter((s) => s.values.length > 0).map((s) => ({ section: s.section, values: s.values }))),
  );
  // Memoised: a new array would redraw the histogram on every render of this screen.
  const scale = plan?.scale;
  const cutoffs = useMemo(() => (measure.kind === 'final' && scale !== undefined ? sortedCutoffs(scale) : null), [measure.kind, scale]);
  const items = useAfterPaint(book === undefined || plan === undefined ? null : results, 'item analysis', () => itemAnalysisSteps(book!, plan!));

  if (project === null || book === undefined || plan === undefined || stats === null || results === null) {
    return <div className="wb-sections"><p>Open or import a course to see its statistics.</p></div>;
  }

  const categoryName = (id: string | null) => (id === null ? 'not graded' : (plan.categories.find((c) => c.id === id)?.name ?? id));


  return (
    <section className="wb-sections" aria-labelledby={ids.title}>
      <div className="wb-sections-head">
        <h1 id={ids.title}>Sections</h1>
        <div className="wb-sections-actions">
          <Button onClick={() => setDialog('report')}>Report</Button>
        </div>
      </div>

      <div className="wb-sections-controls">
        <label htmlFor={ids.measure}>Statistics of</label>
        <select id={ids.measure} value={measureValue} onChange={(e) => setMeasureValue(e.target.value)} data-testid="measure">
          <option value="final">Final mark (%)</option>
          <optgroup label="Categories">
            {plan.categories.map((c) => <option key={c.id} value={`cat:${c.id}`}>{c.name}</option>)}
          </optgroup>
          <optgroup label="Assessments">
            {book.assessments.map((a) => <option key={a.id} value={`asm:${a.id}`}>{a.name}</option>)}
          </optgroup>
        </select>
        <label htmlFor={ids.quantile}>Quartile method</label>
        <select id={ids.quantile} value={quantileType} onChange={(e) => setQuantileType(Number(e.target.value) as QuantileType)} data-testid="quantile-type">
          {QUANTILE_TYPES.map((t) => <option key={t} value={t}>{QUANTILE_METHODS[t].name}{t === 7 ? ' — default' : ''}</option>)}
        </select>
      </div>
      <p className="wb-hint">{QUANTILE_METHODS[quantileType].description} The method sets Q1, Q3, the fences and so the outliers; the median is always the middle value.</p>

      <section className="wb-panel" aria-labelledby={ids.stats}>
        <h2 id={ids.stats}>Statistics of {stats.label}</h2>
        {measure.kind === 'assessment' && <p className="wb-hint">Item percent of earned scores only; missing, excused and pending cells are left out (counted in the “Left out” row).</p>}
        {measure.kind === 'category' && <p className="wb-hint">Category percent as the plan computes it (after drop-lowest and cap), for students for whom the category counts.</p>}
        <p className="wb-hint">The coefficient of variation assumes a ratio scale with a true zero (percent marks are); it is not defined when the mean is 0.</p>
        <StatisticsTable stats={stats} captionId={ids.stats} />
      </section>

      <Distributions>
        {() => (
          <>
            <BoxPlotFigure stats={stats} />
            <HistogramFigure stats={stats} cutoffs={cutoffs} />
            <EcdfFigure stats={stats} />
            <Letters book={book} students={results.students} scale={plan.scale} stats={stats} />
          </>
        )}
      </Distributions>

      <section className="wb-panel" aria-label="Comparison of sections" aria-busy={!comparison.ready}>
        <h2>Comparing sections on {stats.label}</h2>
        <Computing what="the tests of difference between sections" busy={!comparison.ready} testId="comparison-status" />
        {comparison.ready && <ComparisonPanel comparison={comparison.value} label={stats.label} />}
      </section>

      <section className="wb-panel" aria-label="Item analysis" aria-busy={!items.ready}>
        <h2>Assessments: difficulty and discrimination</h2>
        <Computing what={`the item analysis of ${book.assessments.length} assessment${book.assessments.length === 1 ? '' : 's'}`} busy={!items.ready} testId="item-analysis-status" />
        {items.ready && <ItemAnalysisTable rows={items.value} categoryName={categoryName} />}
      </section>

      {dialog === 'report' && <ReportPreview project={project} results={results.students} quantileType={quantileType} onClose={() => setDialog('none')} />}
    </section>
  );
}

const statistics = new WeakMap<object, Map<string, SectionStatistics>>();

/** The statistics `key` of `owner` (a course result), computed once. */
function remembered(owner: object, key: string, compute: () => SectionStatistics): SectionStatistics {
  let byKey = statistics.get(owner);
  if (byKey === undefined) statistics.set(owner, (byKey = new Map()));
  let s = byKey.get(key);
  if (s === undefined) byKey.set(key, (s = compute()));
  return s;
}

function measureKey(measure: Measure): string {
  return measure.kind === 'final' ? 'final' : measure.kind === 'category' ? `cat:${measure.categoryId}` : `asm:${measure.assessmentId}`;
}

/** The letter-grade chart, its counts taken from the results when the chart is built. */
function Letters({ book, students, scale, stats }: { book: Gradebook; students: readonly StudentResult[]; scale: GradeScale; stats: SectionStatistics }) {
  const dist = useMemo(() => letterDistribution(book, students, scale, stats.sections.map((s) => s.section)), [book, students, scale, stats]);
  return <LetterFigure dist={dist} />;
}

/**
 * The distribution charts' panel. Its figures (their data, controls and SVGs) are built in the
 * first paint only when the panel is on screen then; below the statistics table, as it is in a
 * window of ordinary height, they follow just after that paint (drawSoon.ts), and each chart's
 * SVG after that in its own slice. Once built they update with the statistics like the table.
 */
function Distributions({ children }: { children: () => ReactNode }) {
  const panel = useRef<HTMLElement>(null);
  const [built, setBuilt] = useState<'no' | 'inFirstPaint' | 'late'>('no');
  useLayoutEffect(() => {
    if (built !== 'no' || panel.current === null) return;
    if (inViewport(panel.current)) {
      setBuilt('inFirstPaint');
      return;
    }
    return drawSoon(() => setBuilt('late'));
  }, [built]);
  return (
    <section ref={panel} className="wb-panel" aria-label="Distribution charts" aria-busy={built === 'no'}>
      <h2>Distributions</h2>
      <Computing what="the distribution charts" busy={built === 'no'} testId="charts-status" />
      {built !== 'no' && (
        <ChartsBuiltLate.Provider value={built === 'late'}>
          <div className="wb-charts">{children()}</div>
        </ChartsBuiltLate.Provider>
      )}
    </section>
  );
}

/**
 * A polite live region, present while the panel is shown, saying what is still being computed;
 * empty once the numbers are there (they replace it on screen).
 */
function Computing({ what, busy, testId }: { what: string; busy: boolean; testId: string }) {
  return (
    <p role="status" className={busy ? 'wb-hint wb-computing' : 'wb-visually-hidden'} data-testid={testId}>
      {busy ? `Computing ${what}…` : ''}
    </p>
  );
}
