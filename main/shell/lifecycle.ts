/**
 * Decisions the shell's lifecycle makes, as pure functions: which file a launch asks to open,
 * what the close prompt says and what its answer means, when a crashed renderer is reloaded.
 */
import type { MessageBoxOptions } from 'electron';

/** Extensions the app opens from the command line or the OS ("Open with"). */
export const openableExtensions = ['.weighbridge', '.xlsx', '.xls', '.ods', '.csv', '.tsv', '.txt'] as const;

/**
 * The file named on the command line, if any. argv[0] is the executable; an unpackaged run
 * (`electron .`) has the app folder as argv[1]. Switches (`--foo`) are Chromium's or ours, never
 * files.
 */
export function fileFromArgv(argv: readonly string[], packaged: boolean): string | null {
  const rest = argv.slice(packaged ? 1 : 2);
  for (const arg of rest) {
    if (arg.startsWith('-')) continue;
    const lower = arg.toLowerCase();
    if (openableExtensions.some((ext) => lower.endsWith(ext))) return arg;
  }
  return null;
}

export type CloseChoice = 'save' | 'discard' | 'cancel';

/** Button order of the unsaved-changes prompt; `closeChoice` reads the answer by the same list. */
export const closeButtons: readonly { readonly label: string; readonly choice: CloseChoice }[] = [
  { label: 'Save…', choice: 'save' },
  { label: 'Close without saving', choice: 'discard' },
  { label: 'Cancel', choice: 'cancel' },
];

export const closePrompt: MessageBoxOptions = {
  type: 'warning',
  title: 'Unsaved changes',
  message: 'This course has changes that are not saved.',
  detail: 'Save them to the project file (the window stays open until the save is done), or close without saving — the changes are then lost.',
  buttons: closeButtons.map((b) => b.label),
  defaultId: 0,
  cancelId: closeButtons.findIndex((b) => b.choice === 'cancel'),
  noLink: true,
};

export function closeChoice(response: number): CloseChoice {
  return closeButtons[response]?.choice ?? 'cancel';
}

/**
 * Reload a crashed renderer (the reloaded page then offers the recovery copy), but not forever:
 * after `limit` crashes in one session a fault is presumably deterministic, and the user is told
 * instead. A clean exit is not a crash.
 */
export function createCrashPolicy(limit = 3): { onGone(reason: string): 'reload' | 'give-up' | 'ignore' } {
  let crashes = 0;
  return {
    onGone(reason) {
      if (reason === 'clean-exit') return 'ignore';
      crashes += 1;
      return crashes <= limit ? 'reload' : 'give-up';
    },
  };
}
