/**
 * Drop lowest N — which counted items a category leaves out.
 *
 * Equal items (category = mean of item percents): drop the N lowest percents; that maximises the
 * mean trivially.
 *
 * Total points (category = Σe / Σp over kept items): dropping the lowest percents is NOT always
 * best when items carry different points (Kane, D. M. & Kane, J. M. (2006) "Dropping Lowest
 * Grades", Mathematics Magazine 79(3):181–189 [from memory]: 20/100, 0/2, 10/10, drop one →
 * dropping 0/2 leaves 30/110 = 27.3 %, dropping 20/100 leaves 10/12 = 83.3 %). We keep the k = n − N
 * items maximising Σe/Σp with Dinkelbach's parametric method (Dinkelbach, W. (1967) "On nonlinear
 * fractional programming", Management Science 13(7):492–498 [from memory]):
 *   q₀ = ratio of all items; repeat: S = the k items with the largest e − q·p; q' = Σ_S e / Σ_S p;
 *   stop when q' ≤ q. Every top-k set at the final q is optimal (max Σ_S(e − q·p) = 0 exactly there),
 *   and q rises strictly each round, so the loop ends after finitely many rounds (in practice 2–4).
 *
 * Exactness: the choice is made in exact rational arithmetic on the points snapped to 10⁻⁶ (BigInt),
 * so float noise never decides a tie; the category percent is then computed from the real points.
 *
 * Ties (several optimal choices): among items that compare equal, the one listed FIRST (earliest in
 * assessment order) is dropped — common practice, no source; any choice gives the same percent.
 *
 * At least one item is always kept: asking to drop N ≥ n drops n − 1 (a category with every item
 * dropped would have no score, which no syllabus intends).
 *
 * Cost O(n log n) per round.
 */

export interface DropCandidate {
  /** Points entering the numerator (0 for missing/pending counted as zero). */
  readonly earned: number;
  /** Points possible; > 0. */
  readonly possible: number;
}

export interface DropChoice {
  /** Indices (into the candidates) kept, ascending. */
  readonly kept: readonly number[];
  /** Indices dropped, ascending. */
  readonly dropped: readonly number[];
}

const SNAP = 1_000_000;

/** Points in millionths, exactly. Non-finite input (refused upstream by the parser) counts as 0. */
function toMicro(x: number): bigint {
  const m = Math.round(x * SNAP);
  return Number.isFinite(m) ? BigInt(m) : 0n;
}

/** Possible points in millionths, at least 1 so every ratio stays defined. */
function possibleMicro(x: number): bigint {
  const m = toMicro(x);
  return m > 0n ? m : 1n;
}

/** How many of n items are dropped when the rule asks for `requested`: never all of them. */
export function dropCount(n: number, requested: number): number {
  if (n <= 1 || !(requested > 0)) return 0;
  return Math.min(Math.floor(requested), n - 1);
}

/** Equal-items rule: drop the `requested` lowest percents (earliest first among equal percents). */
export function dropLowestPercents(items: readonly DropCandidate[], requested: number): DropChoice {
  const n = dropCount(items.length, requested);
  const micro = items.map((it) => ({ e: toMicro(it.earned), p: possibleMicro(it.possible) }));
  const order = items.map((_, i) => i);
  order.sort((i, j) => {
    const a = micro[i]!;
    const b = micro[j]!;
    const lhs = a.e * b.p; // compare a.e/a.p with b.e/b.p by cross-multiplication
    const rhs = b.e * a.p;
    if (lhs !== rhs) return lhs < rhs ? -1 : 1;
    return i - j;
  });
  return split(items.length, order.slice(0, n));
}

/** Total-points rule: drop the `requested` items whose removal maximises Σe/Σp of the rest. */
export function dropForTotalPoints(items: readonly DropCandidate[], requested: number): DropChoice {
  const n = dropCount(items.length, requested);
  if (n === 0) return split(items.length, []);
  const keep = items.length - n;
  const micro = items.map((it) => ({ e: toMicro(it.earned), p: possibleMicro(it.possible) }));
  // q = num/den as an exact fraction; start from all items.
  let num = micro.reduce((s, m) => s + m.e, 0n);
  let den = micro.reduce((s, m) => s + m.p, 0n);
  let kept = topK(micro, keep, num, den);
  for (;;) {
    const nextNum = kept.reduce((s, i) => s + micro[i]!.e, 0n);
    const nextDen = kept.reduce((s, i) => s + micro[i]!.p, 0n);
    // q' > q ?  nextNum/nextDen > num/den  ⇔  nextNum·den > num·nextDen (dens > 0)
    if (nextNum * den <= num * nextDen) break;
    num = nextNum;
    den = nextDen;
    kept = topK(micro, keep, num, den);
  }
  const keptSet = new Set(kept);
  return split(
    items.length,
    items.map((_, i) => i).filter((i) => !keptSet.has(i)),
  );
}

/** The k indices with the largest e·den − num·p (i.e. e − q·p scaled by den > 0); later index wins ties. */
function topK(micro: readonly { e: bigint; p: bigint }[], k: number, num: bigint, den: bigint): number[] {
  const key = micro.map((m) => m.e * den - num * m.p);
  const order = micro.map((_, i) => i);
  order.sort((i, j) => {
    const a = key[i]!;
    const b = key[j]!;
    if (a !== b) return a > b ? -1 : 1;
    return j - i; // keep the later item, so the earlier one is dropped
  });
  return order.slice(0, k);
}

function split(length: number, droppedIdx: readonly number[]): DropChoice {
  const dropped = new Set(droppedIdx);
  const kept: number[] = [];
  const out: number[] = [];
  for (let i = 0; i < length; i++) (dropped.has(i) ? out : kept).push(i);
  return { kept, dropped: out };
}
