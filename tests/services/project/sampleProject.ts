/**
 * A small, complete course for I/O tests (invented names and numbers — input to round trips, not
 * evidence for any computed value).
 */
import type { CourseProject } from '../../../renderer/bridge/contract';

export function sampleProject(overrides: Partial<CourseProject> = {}): CourseProject {
  return {
    title: 'Test course',
    gradebook: {
      students: [
        { id: 'S1', name: 'Zoë Ångström', section: 'A', email: 'z@example.edu' },
        { id: 'S2', name: '=HYPERLINK("x")', section: 'A' },
        { id: 'S3', name: 'Émile Noël', section: 'B' },
      ],
      assessments: [
        { id: 'Q1', name: 'Quiz 1', possible: 10 },
        { id: 'Q2', name: 'Quiz 2', possible: 10 },
        { id: 'EX', name: 'Exam', possible: 50 },
      ],
      scores: [
        [{ kind: 'earned', points: 8 }, { kind: 'earned', points: 9.5 }, { kind: 'earned', points: 41 }],
        [{ kind: 'missing' }, { kind: 'excused' }, { kind: 'earned', points: 30 }],
        [{ kind: 'earned', points: 10 }, { kind: 'pending' }, { kind: 'earned', points: -2 }],
      ],
    },
    plan: {
      categories: [
        { id: 'quiz', name: 'Quizzes', weight: 40, combine: 'equalItems', dropLowest: 0, missingAs: 'zero', capPercent: null, droppedForCourse: false },
        { id: 'exam', name: 'Exam', weight: 60, combine: 'totalPoints', dropLowest: 0, missingAs: 'zero', capPercent: 100, droppedForCourse: false },
      ],
      items: {
        Q1: { categoryId: 'quiz', extraCredit: false },
        Q2: { categoryId: 'quiz', extraCredit: false },
        EX: { categoryId: 'exam', extraCredit: false },
      },
      sectionWaivers: [],
      studentWaivers: [{ studentId: 'S2', categoryId: 'quiz', note: 'accommodation' }],
      markMode: 'current',
      scale: {
        name: 'Letters',
        cutoffs: [
          { letter: 'A', minPercent: 90, gradePoints: 4 },
          { letter: 'B', minPercent: 80, gradePoints: 3 },
          { letter: 'C', minPercent: 70, gradePoints: 2 },
          { letter: 'F', minPercent: 0, gradePoints: 0 },
        ],
      },
      rounding: { decimals: 1 },
      adjustments: [{ kind: 'addPoints', section: 'B', points: 1 }],
    },
    source: null,
    notes: 'Notes with "quotes" and ünïcödé.',
    ...overrides,
  };
}
