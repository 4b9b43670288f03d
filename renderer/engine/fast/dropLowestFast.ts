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
 * get the plain choice without BigInt. Whole and half points — nearly every gradebook — are compared
 * as they are, with no snapping at all (halvesExact). Otherwise we return false and the caller uses
 * the plain functions. Property-tested equal to them (tests/engine/fast/).
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
 * The common case, decided on the points as they are: every earned and possible value a multiple
 * of ½ (possible > 0) and (100·Σ|e| + 1)·(100·Σp + 1) < 2⁵² (the hundredths bound below). Then:
 *   - the plain module's snapped values are the hundredths x·100 exactly (for x = k/2, x·10⁶ =
 *     5·10⁵·k is exact, its snap is itself, a multiple of 10⁴, and its quotient by 10⁴ is 50·k);
 *   - every product of two values is a multiple of ¼ below Σ|e|·Σp < 2⁵²/10⁴ < 2⁴⁰, and so is every
 *     difference of two products: all exact in binary64 (a multiple of ¼ below 2⁵¹ is);
 *   - each key and cross product on the hundredths is exactly 10⁴ times the one on the points.
 * So every comparison below has the same outcome on the points as on the plain module's integers,
 * and the points need no rounding or scaling work.
 */
function halvesExact(earned: Float64Array, possible: Float64Array, n: number): boolean {
  let absE = 0;
  let sumP = 0;
  for (let i = 0; i < n; i++) {
    const p = possible[i]!;
    if (!isHalfOrWhole(earned[i]!) || !isHalfOrWhole(p) || !(p > 0)) return false;
    absE += Math.abs(earned[i]!);
    sumP += p;
  }
  return halvesBoundHolds(absE, sumP);
}

/** x is a multiple of ½ (NaN and ±∞ are not). */
export function isHalfOrWhole(x: number): boolean {
  const x2 = x * 2;
  return x2 === Math.floor(x2);
}

/** The hundredths bound of halvesExact, from Σ|e| and Σp. */
export function halvesBoundHolds(absEarned: number, possible: number): boolean {
  return (100 * absEarned + 1) * (100 * possible + 1) < EXACT / 2;
}

/**
 * How the drop functions learn whether halvesExact holds: CHECK_HALVES (they test it themselves)
 * or HALVES_EXACT (the caller has: fast grading tests it while gathering the cells, one pass fewer).
 */
export type HalvesCheck = typeof CHECK_HALVES | typeof HALVES_EXACT;
export const CHECK_HALVES = 0;
export const HALVES_EXACT = 1;

/**
 * Snap to millionths as dropLowest.ts does (into s.e, s.p), then to hundredths when all allow it.
 * False when the integers are too large for exact double products (the caller then uses the plain
 * functions).
 */
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
export function dropLowestPercentsFast(
  earned: Float64Array,
  possible: Float64Array,
  n: number,
  requested: number,
  s: DropScratch,
  halves: HalvesCheck = CHECK_HALVES,
): boolean {
  return decide(earned, possible, n, requested, s, halves, false);
}

/**
 * The common frame of both rules: how many to drop, then the choice (Dinkelbach for total points,
 * else the lowest ratios) on the points as they are (halvesExact) or on the snapped integers
 * (snapMillionths); false when neither is exact.
 */
function decide(
  earned: Float64Array,
  possible: Float64Array,
  n: number,
  requested: number,
  s: DropScratch,
  halves: HalvesCheck,
  totalPoints: boolean,
): boolean {
  const count = dropCount(n, requested);
  s.dropped.fill(0, 0, n);
  if (count === 0) return true;
  const exact = halves === HALVES_EXACT || halvesExact(earned, possible, n);
  if (!exact && !snapMillionths(earned, possible, n, s)) return false;
  const e = exact ? earned : s.e;
  const p = exact ? possible : s.p;
  if (totalPoints) dinkelbach(e, p, n, count, s);
  else dropLowestRatios(e, p, n, count, s.dropped);
  return true;
}

/** Marks the `count` lowest e/p in `dropped`, earliest first among equals (exact values, see above). */
function dropLowestRatios(e: Float64Array, p: Float64Array, n: number, count: number, dropped: Uint8Array): void {
  for (let d = 0; d < count; d++) {
    let best = -1;
    for (let i = 0; i < n; i++) {
      if (dropped[i] === 1) continue;
      // e_i/p_i < e_best/p_best  ⇔  e_i·p_best < e_best·p_i (p > 0); ties keep the earlier index.
      if (best < 0 || e[i]! * p[best]! < e[best]! * p[i]!) best = i;
    }
    dropped[best] = 1;
  }
}

/**
 * Total points (Dinkelbach): fills s.dropped; false when the plain function must decide.
 *
 * Each round keeps the `count` smallest keys e·den − num·p, earliest first among equal keys (the
 * plain topK's order) — one pass, no sort: for one or two drops (nearly every syllabus) in two
 * registers, else in a short sorted list as the keys stream past. The values compared are exact
 * (halvesExact, snapMillionths), and so is every sum of them in any order: the kept sums are the
 * totals minus the dropped items'.
 */
export function dropForTotalPointsFast(
  earned: Float64Array,
  possible: Float64Array,
  n: number,
  requested: number,
  s: DropScratch,
  halves: HalvesCheck = CHECK_HALVES,
): boolean {
  return decide(earned, possible, n, requested, s, halves, true);
}

function dinkelbach(e: Float64Array, p: Float64Array, n: number, count: number, s: DropScratch): void {
  const { dropped, chosen } = s;
  let totalE = 0;
  let totalP = 0;
  for (let i = 0; i < n; i++) {
    totalE += e[i]!;
    totalP += p[i]!;
  }
  let num = totalE;
  let den = totalP;
  for (;;) {
    if (count <= 2) smallestTwo(e, p, n, num, den, chosen);
    else smallestKeys(e, p, n, count, num, den, s);
    let nextNum = totalE;
    let nextDen = totalP;
    for (let d = 0; d < count; d++) {
      nextNum -= e[chosen[d]!]!;
      nextDen -= p[chosen[d]!]!;
    }
    if (nextNum * den <= num * nextDen) {
      for (let d = 0; d < count; d++) dropped[chosen[d]!] = 1;
      return;
    }
    num = nextNum;
    den = nextDen;
  }
}

/**
 * chosen[0], chosen[1] := the indices of the smallest and second-smallest key e·den − num·p, the
 * earlier index first among equal keys (n ≥ 2; chosen[1] is unused when one item is dropped).
 */
function smallestTwo(e: Float64Array, p: Float64Array, n: number, num: number, den: number, chosen: Int32Array): void {
  let k1 = Infinity;
  let k2 = Infinity;
  let i1 = 0;
  let i2 = 1;
  for (let i = 0; i < n; i++) {
    const k = e[i]! * den - num * p[i]!;
    if (!(k < k2)) continue;
    if (k < k1) {
      k2 = k1;
      i2 = i1;
      k1 = k;
      i1 = i;
    } else {
      k2 = k;
      i2 = i;
    }
  }
  chosen[0] = i1;
  chosen[1] = i2;
}

/** chosen[0 … count−1] := the `count` smallest keys, ascending, the earlier index first among equals. */
function smallestKeys(e: Float64Array, p: Float64Array, n: number, count: number, num: number, den: number, s: DropScratch): void {
  const { key, chosen } = s;
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
}
