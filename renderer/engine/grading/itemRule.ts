/**
 * Looking up an assessment's rule in a plan. Assessment ids are header text from a spreadsheet, so
 * an id may be "constructor" or "__proto__": only the plan's own keys count, never inherited ones.
 */
import type { GradingPlan, ItemRule } from '../model';

export function itemRuleFor(plan: Pick<GradingPlan, 'items'>, assessmentId: string): ItemRule | undefined {
  return Object.hasOwn(plan.items, assessmentId) ? plan.items[assessmentId] : undefined;
}
