/**
 * The printable summary report: ONE self-contained HTML page (its CSS inline, charts as inline
 * SVG, no script, no external reference) — what the desktop shell prints to PDF and what the
 * browser harness renders. Pure over the `document` passed in: it builds on that document (the
 * app's, or a detached one from DOMParser / jsdom) and returns the page as a string.
 */
import type { CourseProject } from '../../bridge/contract';
import { compareSections } from '../../engine/analysis/compareSections';
import { itemAnalysis } from '../../engine/analysis/itemAnalysis';
import { describeLeftOut } from '../../engine/analysis/measure';
import { sectionStatistics } from '../../engine/analysis/sectionStatistics';
import { sortedCutoffs } from '../../engine/grading/gradeScale';
import type { StudentResult } from '../../engine/results';
import type { QuantileType } from '../../engine/stats/quantile';
import { EXPORT_CAUTION } from '../export/exportColumns';
import { boxData, ecdfData, histogramData, letterDistribution } from '../sections/chartData';
import { boxPlotChart, ecdfChart, histogramChart, letterChart } from '../sections/charts';
import { fmt } from '../sections/format';
import { statRows } from '../sections/statRows';
import { planWords, scaleRows } from './planWords';
import { REPORT_CSS } from './reportStyles';

export interface ReportOptions {
  readonly quantileType?: QuantileType;
  /** The report's date (passed in so the function stays pure). */
  readonly date: Date;
}

export const REPORT_CAUTIONS: readonly string[] = [
  EXPORT_CAUTION,
  'Statistics describe these marks only. Sections are not randomly assigned, and small sections make every comparison unstable: a difference between sections is a question to look into, not a verdict on the teaching or the marking.',
];

type Child = Node | string | null | undefined | false;

function builder(doc: Document) {
  return function el(tag: string, attrs: Record<string, string> = {}, ...children: Child[]): HTMLElement {
    const e = doc.createElement(tag);
    for (const [k, v] of Object.entries(attrs)) e.setAttribute(k, v);
    for (const c of children) {
      if (c === null || c === undefined || c === false) continue;
      e.append(typeof c === 'string' ? doc.createTextNode(c) : c);
    }
    return e;
  };
}

function escapeText(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

/** The report page as an HTML string: the report element inside a page with its CSS inline. */
export function buildReportHtml(doc: Document, project: CourseProject, results: readonly StudentResult[], options: ReportOptions): string {
  const body = buildReportElement(doc, project, results, options);
  const dateText = options.date.toISOString().slice(0, 10);
  return `<!doctype html>\n<html lang="en">\n<head>\n<meta charset="utf-8">\n<meta name="color-scheme" content="light">\n<title>${escapeText(`${project.title} — summary report ${dateText}`)}</title>\n<style>\n${REPORT_CSS}\n</style>\n</head>\n<body>\n${body.outerHTML}\n</body>\n</html>\n`;
}

/** The report's content as one <main class="wb-report"> element built on `doc` (not attached). */
export function buildReportElement(doc: Document, project: CourseProject, results: readonly StudentResult[], options: ReportOptions): HTMLElement {
  const el = builder(doc);
  const { gradebook: book, plan } = project;
  const quantileType = options.quantileType ?? 7;
  const stats = sectionStatistics(book, results, { quantileType, measure: { kind: 'final' } });
  const sections = stats.sections.map((s) => s.section);
  const withValues = stats.sections.filter((s) => s.values.length > 0);
  const comparison = compareSections(withValues.map((s) => ({ section: s.section, values: s.values })));
  const items = itemAnalysis(book, plan);
  const words = planWords(book, plan);
  const dateText = options.date.toISOString().slice(0, 10);

  const figure = (chart: string, title: string, node: Element | null, note?: string) =>
    el('figure', { class: 'wb-report-figure', 'data-chart': chart }, node, el('figcaption', {}, title + (note ? ` ${note}` : '')));

  // Statistics table (final marks).
  const columns = [{ key: 'course', label: 'Whole course', summary: stats.course, leftOut: stats.leftOut }, ...stats.sections.map((s) => ({ key: s.section, label: `Section ${s.section}`, summary: s.summary, leftOut: s.leftOut }))];
  const statTable = el(
    'table',
    { class: 'wb-report-table', 'data-testid': 'report-statistics' },
    el('caption', {}, `Final marks (%) per section and for the course; quartiles by ${stats.course.quantileMethod}`),
    el('thead', {}, el('tr', {}, el('th', { scope: 'col' }, 'Statistic'), ...columns.map((c) => el('th', { scope: 'col' }, c.label)))),
    el(
      'tbody',
      {},
      el('tr', {}, el('th', { scope: 'row' }, 'n'), ...columns.map((c) => el('td', { 'data-stat': 'n', 'data-section': c.key }, String(c.summary.n)))),
      el('tr', {}, el('th', { scope: 'row' }, 'Left out'), ...columns.map((c) => el('td', {}, describeLeftOut(c.leftOut) || 'none'))),
      ...statRows(stats.course.quantileMethod).map((r) =>
        el(
          'tr',
          {},
          el('th', { scope: 'row' }, r.label),
          ...columns.map((c) => {
            const d = c.summary[r.key];
            return d.defined
              ? el('td', { 'data-stat': r.key, 'data-section': c.key, 'data-value': String(d.value) }, r.asPercent === true ? `${fmt(d.value * 100, 1)} %` : fmt(d.value))
              : el('td', { class: 'wb-nd' }, `not defined: ${d.reason}`);
          }),
        ),
      ),
      el('tr', {}, el('th', { scope: 'row' }, 'Outliers'), ...columns.map((c) => el('td', {}, c.summary.outliers.length === 0 ? 'none' : c.summary.outliers.map((o) => `${o.label} (${fmt(o.value)})`).join('; ')))),
    ),
  );

  const hist = histogramData(stats.courseValues, { kind: 'sturges' });
  const cutoffs = sortedCutoffs(plan.scale).map((c) => ({ letter: c.letter, minPercent: c.minPercent }));
  const boxes = boxData(stats);
  const series = ecdfData(stats);
  const letters = letterDistribution(book, results, plan.scale, sections);

  const flagged = items.filter((i) => i.flags.length > 0);

  const body = el(
    'main',
    { class: 'wb-report' },
    el('header', {}, el('h1', {}, project.title), el('p', { class: 'wb-report-sub' }, `Summary of final marks — ${book.students.length} students, ${sections.length} section${sections.length === 1 ? '' : 's'}, ${book.assessments.length} assessments. Report date: ${dateText}.`)),
    el('section', { class: 'wb-report-cautions' }, el('h2', {}, 'Before you use these marks'), el('ul', {}, ...REPORT_CAUTIONS.map((c) => el('li', {}, c)))),
    el(
      'section',
      {},
      el('h2', {}, 'Grading plan'),
      el('ul', {}, ...words.categories.map((c) => el('li', {}, c))),
      el('ul', {}, ...words.rules.map((r) => el('li', {}, r))),
      el(
        'table',
        { class: 'wb-report-table wb-report-scale' },
        el('caption', {}, `Grade scale “${plan.scale.name}”: a letter applies from its minimum (inclusive) of the rounded final percent`),
        el('thead', {}, el('tr', {}, el('th', { scope: 'col' }, 'Letter'), el('th', { scope: 'col' }, 'Minimum %'), el('th', { scope: 'col' }, 'Grade points'))),
        el('tbody', {}, ...scaleRows(plan).map((r) => el('tr', {}, el('td', {}, r.letter), el('td', {}, num(r.minPercent)), el('td', {}, r.gradePoints === null ? '—' : num(r.gradePoints))))),
      ),
    ),
    el('section', {}, el('h2', {}, 'Statistics of the final marks'), statTable),
    el(
      'section',
      { class: 'wb-report-charts' },
      el('h2', {}, 'Distributions'),
      figure('boxplot', `Box plots per section (${stats.course.quantileMethod}; whiskers at the most extreme marks inside Tukey's fences, dots are outliers).`, boxes.length === 0 ? null : boxPlotChart(doc, boxes, stats.label)),
      figure('histogram', hist.defined ? `Histogram of the final marks, ${hist.value.rule}; dashed lines are the grade cutoffs.` : `No histogram: ${hist.reason}.`, hist.defined ? histogramChart(doc, hist.value.bins, cutoffs, stats.label) : null),
      figure('ecdf', 'Share of each section at or below each final mark (empirical cumulative distribution).', series.length === 0 ? null : ecdfChart(doc, series, null, stats.label)),
      figure('letters', 'Letter grades: share of each section’s students with a letter.', sections.length === 0 ? null : letterChart(doc, letters.data, letters.letters, letters.sections)),
    ),
    el('section', {}, el('h2', {}, 'Comparing sections'), el('p', { class: 'wb-report-caution' }, comparison.caution), ...comparison.sentences.map((s) => el('p', {}, s)), el('ul', {}, ...comparison.pairs.map((p) => el('li', {}, p.sentence)))),
    el(
      'section',
      {},
      el('h2', {}, 'Assessments that behave oddly'),
      flagged.length === 0
        ? el('p', {}, 'No assessment is flagged (negative or near-zero discrimination, everyone on full marks, or a mean below 30 %).')
        : el('ul', {}, ...flagged.map((i) => el('li', {}, `${i.name}: ${i.flags.map((f) => f.message).join(' ')}`))),
      el('p', { class: 'wb-report-note' }, 'Discrimination is the corrected item–total correlation: Pearson’s r of the item percent with the weighted mark recomputed without that item.'),
    ),
    el('footer', {}, `Weighbridge report, ${dateText}. Generated on this computer; nothing was sent anywhere.`),
  );

  return body;
}

function num(x: number): string {
  return String(Math.round(x * 100) / 100);
}
