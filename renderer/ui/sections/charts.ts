/**
 * The Sections charts, built with Observable Plot on whatever `document` the caller passes (the
 * app's, or a detached one for the printable report). Plot draws the axes and scales; we only pass
 * it the numbers the engine computed, so the box plot follows the chosen quantile method exactly
 * (Plot's own boxY would compute its own quartiles).
 *
 * Plot appends a <style> element to each SVG; the app's CSP (style-src 'self') refuses inline
 * styles, so it is removed and the same rules live in sections.css (see `stripPlotStyle`).
 *
 * Marks carry `className`s that tests and CSS use to find them: wb-box, wb-whisker, wb-median,
 * wb-outlier, wb-bin, wb-cutoff, wb-ecdf-step, wb-ecdf-mark, wb-letter-bar (the letter grid's cells),
 * wb-letter-count.
 */
import * as Plot from '@observablehq/plot';
import type { Bin } from '../../engine/stats/histogram';
import type { EcdfStep } from '../../engine/stats/ecdf';

export const CHART_WIDTH = 640;
const COLOR_SCHEME = 'observable10';

export interface BoxDatum {
  readonly section: string;
  readonly n: number;
  readonly q1: number;
  readonly median: number;
  readonly q3: number;
  readonly whiskerLow: number;
  readonly whiskerHigh: number;
  readonly outliers: readonly { readonly label: string; readonly value: number }[];
}

export interface EcdfSeries {
  readonly section: string;
  readonly steps: readonly EcdfStep[];
}

export interface LetterDatum {
  readonly section: string;
  readonly letter: string;
  readonly count: number;
  /** count / students with a letter in the section. */
  readonly share: number;
}

/**
 * Makes Plot's SVG fit the app: removes the inline <style> (refused by the CSP; sections.css and
 * report.css carry the same rules), and gives the labelled <g> groups Plot emits an explicit
 * role="group" (ARIA forbids aria-label on an element without a role). The SVG itself is one
 * image named by its aria-label; its numbers are in the table beside it.
 */
export function stripPlotStyle<T extends Element>(node: T): T {
  node.querySelectorAll('style').forEach((s) => s.remove());
  node.querySelectorAll('g[aria-label]').forEach((g) => {
    if (!g.hasAttribute('role')) g.setAttribute('role', 'group');
  });
  if (node.tagName.toLowerCase() === 'svg') node.setAttribute('role', 'img');
  return node;
}

const f2 = (x: number) => (Math.round(x * 100) / 100).toString();

/** Side-by-side boxes per section: box Q1–Q3, whiskers, median tick, outliers as dots. */
export function boxPlotChart(doc: Document, boxes: readonly BoxDatum[], yLabel: string): SVGSVGElement | HTMLElement {
  const sections = boxes.map((b) => b.section);
  const outliers = boxes.flatMap((b) => b.outliers.map((o) => ({ section: b.section, ...o })));
  const boxTitle = (b: BoxDatum) =>
    `${b.section} (n = ${b.n}): whiskers ${f2(b.whiskerLow)}–${f2(b.whiskerHigh)}, Q1 ${f2(b.q1)}, median ${f2(b.median)}, Q3 ${f2(b.q3)}, ${b.outliers.length} outlier${b.outliers.length === 1 ? '' : 's'}`;
  return stripPlotStyle(
    Plot.plot({
      document: doc,
      width: CHART_WIDTH,
      height: 320,
      marginLeft: 50,
      ariaLabel: `Box plots of ${yLabel} per section`,
      x: { domain: sections, label: 'Section', padding: 0.4 },
      y: { label: yLabel, grid: true, nice: true },
      color: { domain: sections, scheme: COLOR_SCHEME },
      marks: [
        Plot.ruleX(boxes, { x: 'section', y1: 'whiskerLow', y2: 'q1', className: 'wb-whisker' }),
        Plot.ruleX(boxes, { x: 'section', y1: 'q3', y2: 'whiskerHigh', className: 'wb-whisker' }),
        Plot.barY(boxes, { x: 'section', y1: 'q1', y2: 'q3', fill: 'section', fillOpacity: 0.35, stroke: 'section', title: boxTitle, className: 'wb-box' }),
        Plot.tickY(boxes, { x: 'section', y: 'median', strokeWidth: 3, title: (b: BoxDatum) => `${b.section} median ${f2(b.median)}`, className: 'wb-median' }),
        Plot.dot(outliers, { x: 'section', y: 'value', r: 4, stroke: 'currentColor', fill: 'section', title: (o: { label: string; value: number; section: string }) => `Outlier in ${o.section}: ${o.label}, ${f2(o.value)}`, className: 'wb-outlier' }),
      ],
    }),
  );
}

/** Histogram from the engine's bins, with the grade cutoffs as labelled reference lines. */
export function histogramChart(
  doc: Document,
  bins: readonly Bin[],
  cutoffs: readonly { readonly letter: string; readonly minPercent: number }[],
  xLabel: string,
): SVGSVGElement | HTMLElement {
  const lo = Math.min(...bins.map((b) => b.lower));
  const hi = Math.max(...bins.map((b) => b.upper));
  // Only the cutoffs that fall among the marks; a cutoff at 0 below every mark says nothing.
  const inside = cutoffs.filter((c) => c.minPercent > lo && c.minPercent <= hi);
  return stripPlotStyle(
    Plot.plot({
      document: doc,
      width: CHART_WIDTH,
      height: 300,
      marginLeft: 50,
      marginTop: 34,
      ariaLabel: `Histogram of ${xLabel}`,
      x: { label: xLabel, domain: [lo, hi] },
      y: { label: 'Students', grid: true },
      marks: [
        Plot.rectY(bins, { x1: 'lower', x2: 'upper', y: 'count', inset: 0.5, fill: 'var(--wb-accent)', title: (b: Bin) => `${f2(b.lower)} to ${f2(b.upper)}: ${b.count} students`, className: 'wb-bin' }),
        Plot.ruleX(inside, { x: 'minPercent', stroke: 'var(--wb-warning)', strokeDasharray: '4 3', title: (c: { letter: string; minPercent: number }) => `${c.letter} from ${f2(c.minPercent)} %`, className: 'wb-cutoff' }),
        // Labels alternate between two rows so neighbouring cutoffs stay readable.
        Plot.text(inside.filter((_, i) => i % 2 === 0), { x: 'minPercent', frameAnchor: 'top', text: 'letter', dy: -12, fill: 'currentColor', ariaHidden: 'true' }),
        Plot.text(inside.filter((_, i) => i % 2 === 1), { x: 'minPercent', frameAnchor: 'top', text: 'letter', dy: 0, fill: 'currentColor', ariaHidden: 'true' }),
        Plot.ruleY([0]),
      ],
    }),
  );
}

/**
 * ECDF per section as a right-continuous step function — one path per section, drawn step-after
 * through its steps: level 0 up to the smallest value, then each step's share from its value to the
 * next distinct value, the last one (100 %) to the right edge — and a movable mark. One path per
 * section rather than one element per step keeps the chart light on a large course (thousands of
 * distinct marks); the step values are in the table beside the chart and the mark reads F(t).
 */
export function ecdfChart(doc: Document, series: readonly EcdfSeries[], at: number | null, xLabel: string): SVGSVGElement | HTMLElement {
  const sections = series.map((s) => s.section);
  let xMin = at ?? Infinity;
  let xMax = at ?? -Infinity;
  for (const s of series) {
    const first = s.steps[0];
    const last = s.steps[s.steps.length - 1];
    if (first !== undefined && first.x < xMin) xMin = first.x;
    if (last !== undefined && last.x > xMax) xMax = last.x;
  }
  const marks: Plot.Markish[] = series.map((s, k) => {
    const first = s.steps[0];
    const last = s.steps[s.steps.length - 1];
    const points = first === undefined || last === undefined ? [] : [{ x: first.x, p: 0 }, ...s.steps, { x: xMax, p: last.p }];
    return Plot.line(points, {
      x: 'x',
      y: 'p',
      curve: 'step-after',
      stroke: () => s.section,
      strokeWidth: 2,
      title: () => `${s.section}: ${s.steps.length} step${s.steps.length === 1 ? '' : 's'}, from ${f2(first?.x ?? 0)} to ${f2(last?.x ?? 0)}`,
      className: `wb-ecdf-step-${k}`,
    });
  });
  if (at !== null) marks.push(Plot.ruleX([at], { stroke: 'currentColor', strokeDasharray: '2 2', className: 'wb-ecdf-mark' }));
  const svg = stripPlotStyle(
    Plot.plot({
      document: doc,
      width: CHART_WIDTH,
      height: 300,
      marginLeft: 50,
      ariaLabel: `Empirical cumulative distribution of ${xLabel} per section`,
      x: { label: xLabel, domain: [xMin, xMax] },
      y: { label: 'Share at or below', domain: [0, 1], tickFormat: '.0%', grid: true },
      color: { domain: sections, scheme: COLOR_SCHEME },
      marks,
    }),
  );
  // Plot's class names cannot hold arbitrary section names: tag each section's group here.
  sections.forEach((section, k) => {
    const g = svg.querySelector(`g.wb-ecdf-step-${k}`);
    g?.classList.add('wb-ecdf-step');
    g?.setAttribute('data-section', section);
    g?.setAttribute('aria-label', `ECDF steps, section ${section}`);
  });
  return svg;
}

/** Share of each letter per section, one panel per section. */
/**
 * Letter grades as a grid: one row per section, one column per letter (highest first), each cell
 * shaded by the share of the section's students with that letter and labelled with the count. A
 * grouped bar per section and letter stops being readable beyond a handful of sections (at 40
 * sections × 12 letters a bar is narrower than a pixel); a grid of shares stays readable and keeps
 * every number on the chart. The count is drawn in a colour chosen against the cell's shade.
 */
export function letterChart(doc: Document, data: readonly LetterDatum[], letters: readonly string[], sections: readonly string[]): SVGSVGElement | HTMLElement {
  const row = 22;
  const maxShare = Math.max(0.01, ...data.map((d) => d.share));
  return stripPlotStyle(
    Plot.plot({
      document: doc,
      width: CHART_WIDTH,
      height: 40 + 30 + row * sections.length,
      marginLeft: 60,
      marginTop: 40,
      marginBottom: 30,
      padding: 0.06,
      ariaLabel: 'Letter-grade distribution per section',
      x: { domain: letters, label: null, axis: 'top', tickSize: 0 },
      y: { domain: sections, label: 'Section', tickSize: 0 },
      color: { type: 'linear', domain: [0, maxShare], range: ['#eef3fb', '#1f4e99'], label: 'Share of section', legend: false },
      marks: [
        Plot.cell(data, { x: 'letter', y: 'section', fill: 'share', title: (d: LetterDatum) => `${d.section}, ${d.letter}: ${d.count} (${f2(d.share * 100)} %)`, className: 'wb-letter-bar' }),
        Plot.text(data, {
          x: 'letter',
          y: 'section',
          text: (d: LetterDatum) => (d.count === 0 ? '' : String(d.count)),
          fill: (d: LetterDatum) => (d.share > maxShare * 0.55 ? '#ffffff' : '#111111'),
          className: 'wb-letter-count',
          ariaHidden: 'true',
        }),
      ],
    }),
  );
}

/** The colour Plot gives each section (same domain and scheme in every chart), for HTML legends. */
export function sectionColors(doc: Document, sections: readonly string[]): Map<string, string> {
  const p = Plot.plot({ document: doc, color: { domain: sections, scheme: COLOR_SCHEME }, marks: [] });
  const scale = p.scale('color');
  const out = new Map<string, string>();
  const range = (scale?.range ?? []) as readonly string[];
  sections.forEach((s, i) => out.set(s, range[i % Math.max(1, range.length)] ?? 'currentColor'));
  return out;
}
