/**
 * How a Plan panel changes the plan: `update(label, change)` runs a planEdits function on the
 * current plan and sends the result to the course store as one undoable step labelled `label`;
 * `update.fail(message)` shows a problem without changing anything.
 */
import type { GradingPlan } from '../../engine/model';

export interface PlanUpdate {
  (label: string, change: (plan: GradingPlan) => GradingPlan): void;
  fail(message: string): void;
}
