/** Small valid payloads (shape only — not evidence of any grading value). */
import type { CourseProject, ImportLayout } from '../../renderer/bridge/contract';

export const layout: ImportLayout = {
  sheets: [{ sheet: 'Scores', headerRow: 0, possibleRow: null, columns: [{ index: 0, header: 'ID', role: 'id' }] }],
  sectionFrom: 'column',
  tokens: { excused: ['EX'], missing: [''], pending: ['P'] },
};

export const project: CourseProject = {
  title: 'Table test',
  gradebook: {
    students: [{ id: 's1', name: 'Ada', section: 'A' }],
    assessments: [{ id: 'q1', name: 'Quiz 1', possible: 10 }],
    scores: [[{ kind: 'earned', points: 7 }]],
  },
  plan: {
    categories: [{ id: 'c', name: 'Quizzes', weight: 100, combine: 'totalPoints', dropLowest: 0, missingAs: 'zero', capPercent: null, droppedForCourse: false }],
    items: { q1: { categoryId: 'c', extraCredit: false } },
    sectionWaivers: [],
    studentWaivers: [],
    markMode: 'current',
    scale: { name: 'Pass/fail', cutoffs: [{ letter: 'P', minPercent: 50 }, { letter: 'F', minPercent: 0 }] },
    rounding: { decimals: 0 },
    adjustments: [],
  },
  source: null,
  notes: '',
};
