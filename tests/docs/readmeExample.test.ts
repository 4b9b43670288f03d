import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const root = fileURLToPath(new URL('../..', import.meta.url));
const examplePath = 'docs/examples/grade-a-course.ts';

describe('README engine example', () => {
  it('is shown in the README exactly as the file that this test runs', () => {
    const readme = readFileSync(`${root}README.md`, 'utf8');
    const example = readFileSync(`${root}${examplePath}`, 'utf8');
    expect(readme).toContain(example.trim());
  });

  it('runs and prints the marks derived by hand', () => {
    const out = execFileSync(process.execPath, ['--import', 'tsx', examplePath], { cwd: root, encoding: 'utf8' });
    const lines = out.trim().split('\n');
    // Hand arithmetic from the plan in the example:
    // S1: quizzes 90 % and 40 %, drop lowest 1 → 90 %; exam 81 %; 0.4·90 + 0.6·81 = 84.6 → 85 (half-up).
    // S2: Quiz 1 excused, so Quiz 2 (70 %) is the only item and is kept; exam 64 %; 0.4·70 + 0.6·64 = 66.4 → 66.
    // S3: exam pending → left out of the current mark; quizzes 0 % (missing as zero) and 100 %, drop lowest → 100 %.
    expect(lines.slice(0, 3)).toEqual(['S1 85 P', 'S2 66 P', 'S3 100 P']);
    // Section A finals 85 and 66: mean 75.5, sample SD √(((85 − 75.5)² + (66 − 75.5)²) / 1) = √180.5.
    const values = [...out.matchAll(/value: ([0-9.]+)/g)].map((m) => Number(m[1]));
    expect(values[0]).toBe(75.5);
    expect(values[1]).toBeCloseTo(Math.sqrt(180.5), 12);
  });
});
