/** Number formatting for the statistics views (display only; the engine's values are untouched). */
import type { Defined } from '../../engine/defined';

/** Fixed decimals with a real minus sign; "−0.00" shown as "0.00". */
export function fmt(x: number, decimals = 2): string {
  const s = x.toFixed(decimals);
  return /^-0(\.0+)?$/.test(s) ? s.slice(1) : s.replace('-', '−');
}

export function fmtDefined(d: Defined<number>, decimals = 2): string {
  return d.defined ? fmt(d.value, decimals) : 'not defined';
}

export function fmtPercent(fraction: number, decimals = 1): string {
  return `${fmt(fraction * 100, decimals)} %`;
}

/** A stable, CSS-safe token for a section name (for data attributes and ids). */
export function sectionKey(section: string): string {
  return section === '' ? '(none)' : section;
}
