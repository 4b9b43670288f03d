/**
 * NIST StRD "Univariate Summary Statistics" — certified sample mean and sample SD (n − 1).
 * Source: NIST Statistical Reference Datasets, files copied into tests/fixtures/nist-strd/
 * (public domain, see ATTRIBUTION.md); tolerances from /work/shared/REFERENCES.md.
 *
 * Accuracy is scored as the log relative error LRE = −log10(|q − c| / |c|) (McCullough 1998,
 * "Assessing the reliability of statistical software: Part I", Am. Stat. 52(4)).
 * Binary64 limits: 1000000.1 and 10000000.1 are not representable, so no double-precision code
 * can exceed ≈ 9.5 digits on NumAcc3 or ≈ 8.3 digits on NumAcc4; the other sets allow ≥ 13.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe as suite, expect, it } from 'vitest';
import { describe, mean, sampleSd } from '../../../renderer/engine/stats';

const dir = fileURLToPath(new URL('../../fixtures/nist-strd/', import.meta.url));

interface NistFile {
  values: number[];
  certifiedMean: number;
  certifiedSd: number;
  n: number;
}

/** Parse a NIST StRD .dat file: certified values from the header, data after "Data: Y" + dashes. */
function readNist(name: string): NistFile {
  const text = readFileSync(`${dir}${name}.dat`, 'utf8');
  const lines = text.split(/\r?\n/);
  const start = lines.findIndex((l) => l.startsWith('Data: Y'));
  expect(start).toBeGreaterThan(0);
  const values = lines.slice(start + 2).map((l) => l.trim()).filter((l) => l !== '').map(Number);
  const grab = (re: RegExp): number => {
    const m = re.exec(text);
    if (m?.[1] === undefined) throw new Error(`${name}: header value ${re} not found`);
    return Number(m[1]);
  };
  return {
    values,
    certifiedMean: grab(/^Sample Mean\b.*?:\s*(\S+)\s*$/m),
    certifiedSd: grab(/^Sample Standard Deviation.*?:\s*(\S+)\s*$/m),
    n: grab(/^Number of Observations:\s*(\d+)/m),
  };
}

const lre = (q: number, c: number): number => (q === c ? Infinity : -Math.log10(Math.abs(q - c) / Math.abs(c)));
const relErr = (q: number, c: number): number => Math.abs(q - c) / Math.abs(c);

/**
 * NIST construction (header of each file; REFERENCES.md): NumAcc1 is 10000001, 10000003,
 * 10000002; NumAcc2–4 are the centre value followed by 500 pairs (centre − 0.1, centre + 0.1).
 * Values are built in tenths as exact integers k and divided by 10: IEEE division of two exact
 * numbers is correctly rounded, i.e. the same double as parsing the decimal text "….1".
 */
function construct(centreTenths: number): number[] {
  const out = [centreTenths / 10];
  for (let i = 0; i < 500; i++) out.push((centreTenths - 1) / 10, (centreTenths + 1) / 10);
  return out;
}

const cases = [
  // name, generated data, table values from REFERENCES.md, relative tolerance, minimum LRE
  { name: 'NumAcc1', generated: [10000001, 10000003, 10000002], mean: 10000002, sd: 1, n: 3, tol: 1e-13, minLre: 13 },
  { name: 'NumAcc2', generated: construct(12), mean: 1.2, sd: 0.1, n: 1001, tol: 1e-13, minLre: 13 },
  { name: 'NumAcc3', generated: construct(10000002), mean: 1000000.2, sd: 0.1, n: 1001, tol: 1e-9, minLre: 9 },
  { name: 'NumAcc4', generated: construct(100000002), mean: 10000000.2, sd: 0.1, n: 1001, tol: 1e-8, minLre: 8 },
] as const;

suite('NIST StRD univariate: NumAcc1–4', () => {
  for (const c of cases) {
    it(`${c.name}: published construction equals the published file`, () => {
      const file = readNist(c.name);
      expect(file.values).toHaveLength(c.n);
      expect(file.n).toBe(c.n);
      expect(c.generated).toEqual(file.values);
      // The header's certified values agree with the table in REFERENCES.md.
      expect(file.certifiedMean).toBe(c.mean);
      expect(file.certifiedSd).toBe(c.sd);
    });

    it(`${c.name}: certified mean and sample SD (LRE ≥ ${c.minLre})`, () => {
      const file = readNist(c.name);
      const m = mean(file.values);
      const s = sampleSd(file.values);
      if (!m.defined || !s.defined) throw new Error('expected defined mean and SD');
      expect(relErr(m.value, file.certifiedMean)).toBeLessThanOrEqual(c.tol);
      expect(relErr(s.value, file.certifiedSd)).toBeLessThanOrEqual(c.tol);
      expect(lre(m.value, file.certifiedMean)).toBeGreaterThanOrEqual(c.minLre);
      expect(lre(s.value, file.certifiedSd)).toBeGreaterThanOrEqual(c.minLre);
      // describe() reports the same numbers.
      const d = describe(file.values);
      expect(d.mean).toEqual(m);
      expect(d.sampleSd).toEqual(s);
    });
  }

  it('NumAcc4 defeats the one-pass Σx² formula (why two-pass is required; REFERENCES.md)', () => {
    const x = readNist('NumAcc4').values;
    const n = x.length;
    let sx = 0;
    let sxx = 0;
    for (const v of x) {
      sx += v;
      sxx += v * v;
    }
    const naive = Math.sqrt((sxx - (sx * sx) / n) / (n - 1));
    // Either NaN (negative variance) or far less accurate than the two-pass 8 digits.
    expect(Number.isNaN(naive) || lre(naive, 0.1) < 4).toBe(true);
  });
});

suite('NIST StRD univariate: PiDigits (from the file, not generated)', () => {
  // PiDigits differs from the true digits of π (observation 957 is 3, not 8: REFERENCES.md),
  // so it is read from the published observations.
  const values = readFileSync(`${dir}PiDigits.values.txt`, 'utf8')
    .split(/\r?\n/).map((l) => l.trim()).filter((l) => l !== '').map(Number);

  it('has 5000 single-digit observations; observation 957 is 3', () => {
    expect(values).toHaveLength(5000);
    expect(values.every((v) => Number.isInteger(v) && v >= 0 && v <= 9)).toBe(true);
    expect(values[956]).toBe(3);
  });

  it('certified mean 4.53480000000000 and sample SD 2.86733906028871 (LRE ≥ 13)', () => {
    const m = mean(values);
    const s = sampleSd(values);
    if (!m.defined || !s.defined) throw new Error('expected defined mean and SD');
    expect(relErr(m.value, 4.5348)).toBeLessThanOrEqual(1e-13);
    expect(relErr(s.value, 2.86733906028871)).toBeLessThanOrEqual(1e-13);
    expect(lre(m.value, 4.5348)).toBeGreaterThanOrEqual(13);
    expect(lre(s.value, 2.86733906028871)).toBeGreaterThanOrEqual(13);
  });
});
