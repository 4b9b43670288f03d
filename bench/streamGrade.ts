/**
 * BENCH-ONLY streaming grader — NOT the product's CLI. It shows what `weighbridge grade` could do
 * on a million rows if it streamed (see bench/LATEST.md "CLI change"): the CSV is parsed row by row
 * (papaparse step mode on a file stream), every cell goes through the engine's parseScore, and the
 * engine's createStreamGrader keeps 8 bytes + two references per student; finals, letters and the
 * section statistics come from the same fast path that is property-tested equal to gradeCourse.
 *
 * It assumes the bench generator's layout (ID, Name, Section, assessments; row 2 = points
 * possible) instead of running layout detection, and reports problems only as a count.
 *
 *   tsx bench/streamGrade.ts <file.csv> <plan.json>   → one JSON line on stdout
 */
import { createReadStream } from 'node:fs';
import Papa from 'papaparse';
import type { Assessment, Score } from '../renderer/engine/model';
import { DEFAULT_TOKENS, parseScore } from '../renderer/engine/grading';
import { createStreamGrader, sectionFinalStatistics, type StreamGrader } from '../renderer/engine/fast';
import { loadPlanFile } from '../main/services/project';

async function main(): Promise<void> {
  const [csvPath, planPath] = process.argv.slice(2);
  if (csvPath === undefined || planPath === undefined) throw new Error('usage: streamGrade <file.csv> <plan.json>');
  const plan = await loadPlanFile(planPath);
  if (!plan.ok) throw new Error(plan.message);
  const started = performance.now();
  let header: string[] | null = null;
  let assessments: Assessment[] = [];
  let grader: StreamGrader | null = null;
  let rows = 0;
  let problems = 0;
  await new Promise<void>((resolve, reject) => {
    Papa.parse<string[]>(createReadStream(csvPath, 'utf8'), {
      header: false,
      skipEmptyLines: true,
      step: (result) => {
        const cells = result.data;
        if (header === null) {
          header = cells;
          return;
        }
        if (grader === null) {
          assessments = header.slice(3).map((name, i) => ({ id: name, name, possible: Number(cells[3 + i]) }));
          grader = createStreamGrader(assessments, plan.value);
          return;
        }
        const { row } = grader;
        for (let a = 0; a < assessments.length; a++) {
          const parsed = parseScore(cells[3 + a] ?? '', assessments[a]!.possible, DEFAULT_TOKENS);
          if (!parsed.ok) problems++;
          const score: Score = parsed.ok ? parsed.score : { kind: 'missing' };
          row.state[a] = score.kind === 'earned' ? 0 : score.kind === 'missing' ? 1 : score.kind === 'excused' ? 2 : 3;
          row.earned[a] = score.kind === 'earned' && Number.isFinite(score.points) && score.points > 0 ? score.points : 0;
        }
        grader.add({ id: cells[0] ?? '', name: cells[1] ?? '', section: cells[2] ?? '' });
        rows++;
      },
      complete: () => resolve(),
      error: (e: Error) => reject(e),
    });
  });
  if (grader === null) throw new Error('no rows');
  const { course, grades } = (grader as StreamGrader).finish();
  const stats = sectionFinalStatistics(course, grades);
  const seconds = (performance.now() - started) / 1000;
  process.stdout.write(
    `${JSON.stringify({ rows, problems, seconds, courseMean: stats.course.summary.mean, sections: stats.sections.length, maxRssMiB: process.resourceUsage().maxRSS / 1024 })}\n`,
  );
}

main().catch((e: unknown) => {
  process.stderr.write(`streamGrade: ${e instanceof Error ? e.message : String(e)}\n`);
  process.exitCode = 1;
});
