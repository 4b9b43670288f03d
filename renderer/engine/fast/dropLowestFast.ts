/**
 * Drop lowest N on typed arrays, making the SAME choice as grading/dropLowest.ts:
 *   - equal items: drop the N lowest e/p, earliest first among equals;
 *   - total points: Dinkelbach's method (Dinkelbach 1967), dropping each round the N items with the
 *     smallest e·den − num·p, earliest first among equals, until the ratio stops rising.
 * The plain module decides in exact rational arithmetic on points snapped to 10⁻⁶ (BigInt). Every
 * comparison it makes is between products of those snapped integers, and each is unchanged when
 * all of them are divided by a common factor. So when every snapped value is a multiple of 10⁴
 * (points in hundredths — whole and half points always are) we compare the quotients, and when
 * every product that can occur stays below 2⁵³ the comparisons are exact in binary64 too; we then
 * get the plain choice without BigInt. Otherwise we return false and the caller uses the plain
 * functions. Property-tested equal to them (tests/engine/fast/).
 *
 * Cost O(N·n) per round with no allocation (n items, N dropped; both small).
 */
import { dropCount } from '../grading/dropLowest';

const SNAP = 1_000_000;
const CENTI = 10_000; // 10⁻² points in millionths
const EXACT = 2 ** 53;

export interface DropScratch {
  /** Snapped earned / possible of the candidates (integers in a common unit). */
  readonly e: Float64Array;
  readonly p: Float64Array;
  readonly key: Float64Array;
  /** 1 where the candidate is dropped. */
  readonly dropped: Uint8Array;
}

export function dropScratch(size: number): DropScratch {
  return { e: new Float64Array(size), p: new Float64Array(size), key: new Float64Array(size), dropped: new Uint8Array(size) };
}

/**
 * Snap to millionths as dropLowest.ts does, then to hundredths when all allow it. False when the
 * integers are too large for exact double products (the caller then uses the plain functions).
 */
function snapAll(earned: Float64Array, possible: Float64Array, n: number, s: DropScratch): boolean {
  let centi = true;
  let sumE = 0;
  let sumP = 0;
  for (let i = 0; i < n; i++) {
    const e = Math.round(earned[i]! * SNAP);
    let p = Math.round(possible[i]! * SNAP);
    if (!(p > 0)) p = 1;
    if (!Number.isFinite(e) || !Number.isFinite(p) || e > EXACT || p > EXACT) return false;
    s.e[i] = e;
    s.p[i] = p;
    if (e % CENTI !== 0 || p % CENTI !== 0) centi = false;
    sumE += e;
    sumP += p;
  }
  if (centi) {
    for (let i = 0; i < n; i++) {
      s.e[i] = s.e[i]! / CENTI;
      s.p[i] = s.p[i]! / CENTI;
    }
    sumE /= CENTI;
    sumP /= CENTI;
  }
  // Every product compared below is at most (Σe + 1)·(Σp + 1).
  return (sumE + 1) * (sumP + 1) < EXACT / 2; // halved: slack for the rounding of this bound itself
}

/** Mark the `count` smallest keys as dropped, the earliest index first among equal keys. */
function dropSmallest(key: Float64Array, n: number, count: number, dropped: Uint8Array): void {
  dropped.fill(0, 0, n);
  for (let d = 0; d < count; d++) {
    let best = -1;
    for (let i = 0; i < n; i++) {
      if (dropped[i] === 1) continue;
      if (best < 0 || key[i]! < key[best]!) best = i;
    }
    dropped[best] = 1;
  }
}

/**
 * Equal items: fills s.dropped; false when the plain function must decide. Percents compare by
 * cross-multiplication, so the "key" of the selection is replaced by a pairwise test.
 */
export function dropLowestPercentsFast(earned: Float64Array, possible: Float64Array, n: number, requested: number, s: DropScratch): boolean {
  const count = dropCount(n, requested);
  s.dropped.fill(0, 0, n);
  if (count === 0) return true;
  if (!snapAll(earned, possible, n, s)) return false;
  const { e, p, dropped } = s;
  for (let d = 0; d < count; d++) {
    let best = -1;
    for (let i = 0; i < n; i++) {
      if (dropped[i] === 1) continue;
      // e_i/p_i < e_best/p_best  ⇔  e_i·p_best < e_best·p_i (p > 0); ties keep the earlier index.
      if (best < 0 || e[i]! * p[best]! < e[best]! * p[i]!) best = i;
    }
    dropped[best] = 1;
  }
  return true;
}

/** Total points (Dinkelbach): fills s.dropped; false when the plain function must decide. */
export function dropForTotalPointsFast(earned: Float64Array, possible: Float64Array, n: number, requested: number, s: DropScratch): boolean {
  const count = dropCount(n, requested);
  s.dropped.fill(0, 0, n);
  if (count === 0) return true;
  if (!snapAll(earned, possible, n, s)) return false;
  const { e, p, key, dropped } = s;
  let num = 0;
  let den = 0;
  for (let i = 0; i < n; i++) {
    num += e[i]!;
    den += p[i]!;
  }
  for (;;) {
    for (let i = 0; i < n; i++) key[i] = e[i]! * den - num * p[i]!;
    dropSmallest(key, n, count, dropped);
    let nextNum = 0;
    let nextDen = 0;
    for (let i = 0; i < n; i++) {
      if (dropped[i] === 1) continue;
      nextNum += e[i]!;
      nextDen += p[i]!;
    }
    if (nextNum * den <= num * nextDen) return true;
    num = nextNum;
    den = nextDen;
  }
}
