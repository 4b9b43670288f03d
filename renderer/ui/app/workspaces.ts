/**
 * The workspaces the frame can show, in switcher order (Ctrl+1 … Ctrl+N follow this order).
 * Adding a workspace is one entry here.
 */
import type { ComponentType } from 'react';
import { ImportWorkspace } from '../import/ImportWorkspace';
import { RosterWorkspace } from '../roster/RosterWorkspace';
import { PlanWorkspace } from '../plan/PlanWorkspace';
import { ResultsWorkspace } from '../results/ResultsWorkspace';
import { SectionsWorkspace } from '../sections/SectionsWorkspace';

export type WorkspaceId = 'import' | 'roster' | 'plan' | 'results' | 'sections';

export interface WorkspaceEntry {
  readonly id: WorkspaceId;
  readonly label: string;
  readonly component: ComponentType;
}

export const workspaces: readonly WorkspaceEntry[] = [
  { id: 'import', label: 'Import', component: ImportWorkspace },
  { id: 'roster', label: 'Roster', component: RosterWorkspace },
  { id: 'plan', label: 'Plan', component: PlanWorkspace },
  { id: 'results', label: 'Results', component: ResultsWorkspace },
  { id: 'sections', label: 'Sections', component: SectionsWorkspace },
];

/** The workspace shown after a course opens. */
export const defaultWorkspace: WorkspaceId = 'roster';
