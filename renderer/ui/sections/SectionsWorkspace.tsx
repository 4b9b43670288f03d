/**
 * Sections: do the marks make sense, and are sections taught or marked by different people
 * consistent? Statistics per section and for the course on any measure, four distribution
 * charts, the comparison in plain words, and the per-assessment item analysis. Also where marks
 * leave the app: the export dialog and the printable report.
 *
 * Every number is the engine's (analysis/, stats/); this screen arranges and labels them.
 */
import { useId, useMemo, useState } from 'react';
import { compareSections } from '../../engine/analysis/compareSections';
import { itemAnalysis } from '../../engine/analysis/itemAnalysis';
import type { Measure } from '../../engine/analysis/measure';
import { sectionStatistics } from '../../engine/analysis/sectionStatistics';
import { sortedCutoffs } from '../../engine/grading/gradeScale';
import { QUANTILE_METHODS, QUANTILE_TYPES, type QuantileType } from '../../engine/stats/quantile';
import { useCourseStore } from '../../state/courseStore';
import { Button } from '../common/Button';
import { ReportPreview } from '../report/ReportPreview';
import { letterDistribution } from './chartData';
import { ComparisonPanel } from './ComparisonPanel';
import { ItemAnalysisTable } from './ItemAnalysisTable';
import { BoxPlotFigure, EcdfFigure, HistogramFigure, LetterFigure } from './SectionCharts';
import { StatisticsTable } from './StatisticsTable';
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
    if (book === undefined || students === undefined) return null;
    const s = sectionStatistics(book, students, { quantileType, measure });
    if (measure.kind !== 'category') return s;
    const name = plan?.categories.find((c) => c.id === measure.categoryId)?.name ?? measure.categoryId;
    return { ...s, label: `${name} (category %)` };
  }, [book, students, quantileType, measure, plan]);

  const comparison = useMemo(
    () => (stats === null ? null : compareSections(stats.sections.filter((s) => s.values.length > 0).map((s) => ({ section: s.section, values: s.values })))),
    [stats],
  );
  const items = useMemo(() => (book === undefined || plan === undefined ? [] : itemAnalysis(book, plan)), [book, plan]);
  const letters = useMemo(
    () => (book === undefined || plan === undefined || students === undefined || stats === null ? null : letterDistribution(book, students, plan.scale, stats.sections.map((s) => s.section))),
    [book, plan, students, stats],
  );

  if (project === null || book === undefined || plan === undefined || stats === null || comparison === null || letters === null || results === null) {
    return <div className="wb-sections"><p>Open or import a course to see its statistics.</p></div>;
  }

  const categoryName = (id: string | null) => (id === null ? 'not graded' : (plan.categories.find((c) => c.id === id)?.name ?? id));
  const cutoffs = measure.kind === 'final' ? sortedCutoffs(plan.scale) : null;

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

      <section className="wb-panel" aria-label="Distribution charts">
        <h2>Distributions</h2>
        <div className="wb-charts">
          <BoxPlotFigure stats={stats} />
          <HistogramFigure stats={stats} cutoffs={cutoffs} />
          <EcdfFigure stats={stats} />
          <LetterFigure dist={letters} />
        </div>
      </section>

      <section className="wb-panel" aria-label="Comparison of sections">
        <h2>Comparing sections on {stats.label}</h2>
        <ComparisonPanel comparison={comparison} label={stats.label} />
      </section>

      <section className="wb-panel" aria-label="Item analysis">
        <h2>Assessments: difficulty and discrimination</h2>
        <ItemAnalysisTable rows={items} categoryName={categoryName} />
      </section>

      {dialog === 'report' && <ReportPreview project={project} results={results.students} quantileType={quantileType} onClose={() => setDialog('none')} />}
    </section>
  );
}
