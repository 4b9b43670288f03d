// Grade a small course and summarise one section with the engine alone (no files, no UI).
import { gradeCourse, describeLine, stats, type Gradebook, type GradingPlan } from '../../renderer/engine';

const book: Gradebook = {
  students: [
    { id: 'S1', name: 'Ines Okafor', section: 'A' },
    { id: 'S2', name: 'Tomas Lindqvist', section: 'A' },
    { id: 'S3', name: 'Mei Tanaka', section: 'B' },
  ],
  assessments: [
    { id: 'Quiz 1', name: 'Quiz 1', possible: 10 },
    { id: 'Quiz 2', name: 'Quiz 2', possible: 10 },
    { id: 'Exam', name: 'Exam', possible: 100 },
  ],
  scores: [
    [{ kind: 'earned', points: 9 }, { kind: 'earned', points: 4 }, { kind: 'earned', points: 81 }],
    [{ kind: 'excused' }, { kind: 'earned', points: 7 }, { kind: 'earned', points: 64 }],
    [{ kind: 'missing' }, { kind: 'earned', points: 10 }, { kind: 'pending' }],
  ],
};

const plan: GradingPlan = {
  categories: [
    { id: 'quizzes', name: 'Quizzes', weight: 40, combine: 'equalItems', dropLowest: 1, missingAs: 'zero', capPercent: 100, droppedForCourse: false },
    { id: 'exam', name: 'Exam', weight: 60, combine: 'totalPoints', dropLowest: 0, missingAs: 'zero', capPercent: null, droppedForCourse: false },
  ],
  items: {
    'Quiz 1': { categoryId: 'quizzes', extraCredit: false },
    'Quiz 2': { categoryId: 'quizzes', extraCredit: false },
    Exam: { categoryId: 'exam', extraCredit: false },
  },
  sectionWaivers: [],
  studentWaivers: [],
  markMode: 'current',
  scale: { name: 'Pass/fail', cutoffs: [{ letter: 'P', minPercent: 50, passing: true }, { letter: 'F', minPercent: 0 }] },
  rounding: { decimals: 0 },
  adjustments: [],
};

const course = gradeCourse(book, plan);
for (const r of course.students) console.log(r.studentId, r.final, r.letter);

// Mei's exam is pending, so her current mark rests on quizzes alone (weights re-normalised to 100 %).
const names = { category: (id: string) => id, assessment: (id: string) => id };
for (const line of course.students[2]!.lines) console.log(describeLine(line, names));

const sectionA = course.students.filter((r) => r.section === 'A' && r.final !== null).map((r) => r.final!);
const summary = stats.describe(sectionA, { quantileType: 7 });
console.log(summary.quantileMethod, summary.mean, summary.sampleSd);
