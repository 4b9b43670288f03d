/**
 * What the frame offers every workspace: switching workspace, short notices, asking for a file
 * path (native dialog in the desktop app, a path field in the browser harness) and handing a
 * spreadsheet path to the Import workspace.
 */
import { createContext, useContext } from 'react';
import type { FileKind } from '../../bridge/contract';
import type { WorkspaceId } from './workspaces';

export type NoticeTone = 'info' | 'success' | 'error';

export interface PathRequest {
  readonly kind: FileKind;
  readonly mode: 'open' | 'save';
  /** Dialog title, e.g. "Open a spreadsheet". */
  readonly title: string;
  readonly suggestedName?: string;
}

/** A spreadsheet the user asked to import (from the menu, a drop, or the Import workspace itself). */
export interface ImportRequest {
  readonly path: string;
  /** Distinct per request, so asking for the same file twice re-reads it. */
  readonly serial: number;
}

export interface FrameApi {
  readonly workspace: WorkspaceId;
  showWorkspace(id: WorkspaceId): void;
  notify(message: string, tone?: NoticeTone): void;
  /** The chosen path, or null when the user cancelled. */
  choosePath(request: PathRequest): Promise<string | null>;
  readonly importRequest: ImportRequest | null;
  requestImport(path: string): void;
  /** The Import workspace took the request; forget it so a remount does not read the file again. */
  clearImportRequest(): void;
  openProject(path?: string): Promise<void>;
  save(): Promise<boolean>;
  saveAs(): Promise<boolean>;
}

export const FrameContext = createContext<FrameApi | null>(null);

export function useFrame(): FrameApi {
  const frame = useContext(FrameContext);
  if (frame === null) throw new Error('useFrame() needs the app frame above it');
  return frame;
}
