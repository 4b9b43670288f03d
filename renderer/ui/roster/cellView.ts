/**
 * How a roster cell looks and reads: the visible text, a symbol that carries the state without
 * colour, and the words a screen reader announces. One function so the grid, its legend and the
 * tests agree.
 */
import type { Score } from '../../engine/model';

export type CellState = 'earned' | 'above' | 'missing' | 'excused' | 'pending';

export interface CellView {
  readonly state: CellState;
  /** Text shown in the cell. */
  readonly text: string;
  /** Struck through and marked: the student's drop-lowest rule left this item out. */
  readonly dropped: boolean;
  /** Full spoken description, e.g. "18 of 20, dropped by drop lowest". */
  readonly label: string;
}

const pointsFormat = new Intl.NumberFormat('en', { maximumFractionDigits: 2, useGrouping: false });

/** Formatted points, by value: a screen of scores holds few distinct values, formatting is not cheap. */
const formatted = new Map<number, string>();
const FORMATTED_KEEP = 4096;

export function formatPoints(points: number): string {
  // A Map key does not tell -0 from 0, which the format does ("-0").
  if (Object.is(points, -0)) return pointsFormat.format(points);
  let text = formatted.get(points);
  if (text === undefined) {
    text = pointsFormat.format(points);
    if (formatted.size < FORMATTED_KEEP) formatted.set(points, text);
  }
  return text;
}

/** `dropped`: the student's drop-lowest rule left this item out (droppedItems.ts). */
export function cellView(score: Score | undefined, possible: number, dropped: boolean): CellView {
  const droppedWords = dropped ? ', dropped by drop lowest' : '';
  if (score === undefined || score.kind === 'missing') {
    return { state: 'missing', text: '—', dropped, label: `missing${droppedWords}` };
  }
  if (score.kind === 'excused') return { state: 'excused', text: 'EX', dropped, label: 'EX, excused' };
  if (score.kind === 'pending') return { state: 'pending', text: '…', dropped, label: 'pending' };
  const shown = formatPoints(score.points);
  if (score.points > possible) {
    return { state: 'above', text: `▲ ${shown}`, dropped, label: `${shown} of ${formatPoints(possible)}, above points possible${droppedWords}` };
  }
  return { state: 'earned', text: shown, dropped, label: `${shown} of ${formatPoints(possible)}${droppedWords}` };
}
