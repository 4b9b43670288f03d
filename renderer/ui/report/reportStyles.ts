/**
 * The printable report's CSS, in one place. Used twice: inlined into the standalone page
 * (buildReportHtml) and, in the app, adopted as a constructed stylesheet by the preview
 * (adoptedStyleSheets — not an inline <style>, which the app's CSP refuses). Everything is scoped
 * under .wb-report and always paper-light.
 *
 * A TypeScript string rather than a .css file so that Node (tests, a future CLI) gets the same
 * text as the bundle: Vitest turns imported CSS, even `?raw`, into an empty string.
 */
export const REPORT_CSS = `
.wb-report {
  --wb-accent: #2b6453;
  --wb-warning: #7a5300;
  --wb-surface: #ffffff;
  color: #1d1f21;
  background: #ffffff;
  font-family: system-ui, -apple-system, 'Segoe UI', Roboto, 'Noto Sans', sans-serif;
  font-size: 11pt;
  line-height: 1.4;
  max-width: 190mm;
  margin: 0 auto;
  padding: 8mm 6mm;
}
.wb-report h1 { font-size: 18pt; margin: 0 0 2mm; }
.wb-report h2 { font-size: 13pt; margin: 6mm 0 2mm; border-bottom: 1px solid #c9c6bb; }
.wb-report-sub { color: #55585c; margin: 0; }
.wb-report-cautions, .wb-report-caution { border-left: 4px solid #7a5300; background: #f7ecd2; padding: 1mm 3mm; }
.wb-report-cautions h2 { border: 0; margin-top: 1mm; }
.wb-report-table { border-collapse: collapse; font-variant-numeric: tabular-nums; font-size: 9pt; margin: 2mm 0; }
.wb-report-table caption { text-align: left; font-weight: 600; padding-bottom: 1mm; }
.wb-report-table th, .wb-report-table td { border-bottom: 1px solid #dcdad3; padding: 0.6mm 2mm; text-align: left; vertical-align: top; }
.wb-report-table thead th { border-bottom: 2px solid #8d8a80; }
.wb-report .wb-nd { color: #55585c; font-style: italic; }
.wb-report-figure { margin: 3mm 0; break-inside: avoid; page-break-inside: avoid; }
.wb-report-figure figcaption { font-size: 9pt; color: #55585c; }
.wb-report-figure svg { --plot-background: #ffffff; display: block; height: auto; max-width: 100%; overflow: visible; }
.wb-report-figure svg text, .wb-report-figure svg tspan { white-space: pre; }
.wb-report-note { font-size: 9pt; color: #55585c; }
.wb-report footer { margin-top: 8mm; font-size: 9pt; color: #55585c; }
.wb-report section { break-inside: auto; }
@page { size: A4; margin: 12mm; }
`;
