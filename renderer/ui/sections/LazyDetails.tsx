/**
 * A <details> whose content is built only while it is open. A closed <details> shows nothing and
 * is not in the accessibility tree, so nothing is lost; on a large course the content (the ECDF's
 * table has a row per distinct mark per section, the comparison a sentence per pair of sections)
 * would otherwise be rebuilt on every change.
 */
import { useState, type ReactNode } from 'react';

export function LazyDetails({ summary, className, children }: { summary: ReactNode; className?: string; children: () => ReactNode }) {
  const [open, setOpen] = useState(false);
  return (
    <details className={className} onToggle={(e) => setOpen(e.currentTarget.open)}>
      <summary>{summary}</summary>
      {open && children()}
    </details>
  );
}
