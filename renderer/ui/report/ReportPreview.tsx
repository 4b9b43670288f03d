/**
 * In-app preview of the printable report: the same element buildReportHtml wraps, shown in a
 * full-window dialog; the page's inline <style> is never inserted (the CSP refuses inline
 * styles) — the same REPORT_CSS is adopted as a constructed stylesheet instead. "Print" uses the browser's print (print CSS
 * shows only the report); when the desktop shell offers `printReportToPdf`, "Save as PDF" hands
 * it the self-contained page to print with Electron's printToPDF.
 */
import { useEffect, useId, useMemo, useRef, useState } from 'react';
import { createPortal } from 'react-dom';
import { useBridge } from '../../bridge/BridgeContext';
import type { CourseProject } from '../../bridge/contract';
import type { StudentResult } from '../../engine/results';
import type { QuantileType } from '../../engine/stats/quantile';
import { Button } from '../common/Button';
import { buildReportElement, buildReportHtml } from './buildReportHtml';
import { REPORT_CSS } from './reportStyles';
import './reportPreview.css';

export function ReportPreview({ project, results, quantileType, onClose }: {
  project: CourseProject;
  results: readonly StudentResult[];
  quantileType: QuantileType;
  onClose(): void;
}) {
  const bridge = useBridge();
  const dialog = useRef<HTMLDialogElement>(null);
  const host = useRef<HTMLDivElement>(null);
  const titleId = useId();
  const [pdfStatus, setPdfStatus] = useState<string | null>(null);
  const date = useMemo(() => new Date(), []);

  useEffect(() => {
    const d = dialog.current;
    if (d !== null && !d.open) d.showModal();
    document.body.classList.add('wb-printing-report');
    // The report's CSS as a constructed stylesheet (the CSP refuses inline <style>).
    const sheet = new CSSStyleSheet();
    sheet.replaceSync(REPORT_CSS);
    document.adoptedStyleSheets = [...document.adoptedStyleSheets, sheet];
    return () => {
      document.adoptedStyleSheets = document.adoptedStyleSheets.filter((s) => s !== sheet);
      document.body.classList.remove('wb-printing-report');
      d?.close();
    };
  }, []);

  useEffect(() => {
    const main = buildReportElement(document, project, results, { quantileType, date });
    // The app already has its <main>; the preview holds the same content in an <article>.
    const article = document.createElement('article');
    article.className = 'wb-report';
    article.setAttribute('aria-label', 'Report preview');
    article.append(...Array.from(main.childNodes));
    host.current?.replaceChildren(article);
  }, [project, results, quantileType, date]);

  const savePdf = async () => {
    if (bridge.printReportToPdf === undefined) return;
    const chosen = await bridge.chooseSavePath('report', `${project.title} report.pdf`);
    if (!chosen.ok) return setPdfStatus(chosen.message);
    if (chosen.value === null) return;
    // The self-contained page (inline CSS) is only built here, for the shell; it never enters this document.
    const html = buildReportHtml(document, project, results, { quantileType, date });
    const r = await bridge.printReportToPdf(html, chosen.value);
    setPdfStatus(r.ok ? `Saved ${r.value.path}` : r.message);
  };

  return createPortal(
    <dialog
      ref={dialog}
      className="wb-report-dialog"
      aria-labelledby={titleId}
      onCancel={(e) => {
        e.preventDefault();
        onClose();
      }}
    >
      <div className="wb-report-toolbar">
        <h2 id={titleId}>Printable report</h2>
        <Button tone="primary" onClick={() => window.print()}>Print…</Button>
        {bridge.printReportToPdf !== undefined && <Button onClick={() => void savePdf()}>Save as PDF…</Button>}
        <Button onClick={onClose}>Close</Button>
        <span role="status" className="wb-report-status">{pdfStatus}</span>
      </div>
      <div ref={host} className="wb-report-host" data-testid="report" />
    </dialog>,
    document.body,
  );
}
