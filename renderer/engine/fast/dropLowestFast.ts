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
  /** Candidates chosen to drop in the current round, smallest key first. */
  readonly chosen: Int32Array;
}

export function dropScratch(size: number): DropScratch {
  return { e: new Float64Array(size), p: new Float64Array(size), key: new Float64Array(size), dropped: new Uint8Array(size), chosen: new Int32Array(size) };
}

/**
 * Snap to millionths as dropLowest.ts does, then to hundredths when all allow it. False when the
 * integers are too large for exact double products (the caller then uses the plain functions).
 */
function snapAll(earned: Float64Array, possible: Float64Array, n: number, s: DropScratch): boolean {
  return snapHalves(earned, possible, n, s) || snapMillionths(earned, possible, n, s);
}

/**
 * The common case without rounding work: every earned and possible value a multiple of ½ (possible
 * > 0). For x = k/2 (k an integer, |k| < 2⁵²) x·10⁶ = 5·10⁵·k is exact, so its snap is itself, a
 * multiple of 10⁴, and the quotient by 10⁴ is 50·k = x·100 — also exact. So the hundredths are
 * x·100 and snapMillionths would produce the same integers. False when any value is not a half.
 */
function snapHalves(earned: Float64Array, possible: Float64Array, n: number, s: DropScratch): boolean {
  let sumE = 0;
  let sumP = 0;
  for (let i = 0; i < n; i++) {
    const e2 = earned[i]! * 2;
    const p2 = possible[i]! * 2;
    if (e2 !== Math.floor(e2) || p2 !== Math.floor(p2) || !(p2 > 0) || e2 > EXACT / SNAP || p2 > EXACT / SNAP) return false;
    const e = e2 * 50;
    const p = p2 * 50;
    s.e[i] = e;
    s.p[i] = p;
    sumE += e;
    sumP += p;
  }
  return (sumE + 1) * (sumP + 1) < EXACT / 2;
}

function snapMillionths(earned: Float64Array, possible: Float64Array, n: number, s: DropScratch): boolean {
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

/**
 * Total points (Dinkelbach): fills s.dropped; false when the plain function must decide.
 *
 * Each round keeps the `count` smallest keys e·den − num·p, earliest first among equal keys (the
 * plain topK's order), in a short sorted list as the keys stream past — one pass, no sort. The
 * snapped values are integers whose sums stay below 2⁵³ (snapAll), so every sum is exact in any
 * order: the kept sums are the totals minus the dropped items', with no second pass.
 */
export function dropForTotalPointsFast(earned: Float64Array, possible: Float64Array, n: number, requested: number, s: DropScratch): boolean {
  const count = dropCount(n, requested);
  s.dropped.fill(0, 0, n);
  if (count === 0) return true;
  if (!snapAll(earned, possible, n, s)) return false;
  const { e, p, key, dropped, chosen } = s;
  let totalE = 0;
  let totalP = 0;
  for (let i = 0; i < n; i++) {
    totalE += e[i]!;
    totalP += p[i]!;
  }
  let num = totalE;
  let den = totalP;
  for (;;) {
    let size = 0;
    for (let i = 0; i < n; i++) {
      const k = e[i]! * den - num * p[i]!;
      key[i] = k;
      if (size === count && !(k < key[chosen[size - 1]!]!)) continue;
      // Insert i after every chosen key ≤ k (earlier indices first among equals).
      let at = size < count ? size : size - 1;
      while (at > 0 && key[chosen[at - 1]!]! > k) {
        chosen[at] = chosen[at - 1]!;
        at--;
      }
      chosen[at] = i;
      if (size < count) size++;
    }
    let nextNum = totalE;
    let nextDen = totalP;
    for (let d = 0; d < count; d++) {
      nextNum -= e[chosen[d]!]!;
      nextDen -= p[chosen[d]!]!;
    }
    if (nextNum * den <= num * nextDen) {
      for (let d = 0; d < count; d++) dropped[chosen[d]!] = 1;
      return true;
    }
    num = nextNum;
    den = nextDen;
  }
}
