/**
 * The shell's lifecycle decisions: the file named at launch, the unsaved-changes prompt, and when
 * a crashed renderer is reloaded. Conventions here are common practice, no source (argv layout:
 * Electron docs, `process.argv` in packaged vs `electron .` runs).
 */
import { describe, expect, it } from 'vitest';
import { closeButtons, closeChoice, closePrompt, createCrashPolicy, fileFromArgv } from '../../main/shell/lifecycle';

describe('fileFromArgv', () => {
  it('skips the executable (packaged) or the executable and app folder (unpackaged)', () => {
    expect(fileFromArgv(['/opt/Weighbridge/weighbridge', '/home/me/a.weighbridge'], true)).toBe('/home/me/a.weighbridge');
    expect(fileFromArgv(['/usr/bin/electron', '.', '/home/me/marks.xlsx'], false)).toBe('/home/me/marks.xlsx');
    expect(fileFromArgv(['/usr/bin/electron', '.'], false)).toBeNull();
    expect(fileFromArgv(['/opt/Weighbridge/weighbridge'], true)).toBeNull();
  });

  it('ignores switches and files it cannot open', () => {
    expect(fileFromArgv(['exe', '--no-sandbox', '--enable-logging', 'notes.docx', 'C:\\m\\Scores.CSV'], true)).toBe('C:\\m\\Scores.CSV');
    expect(fileFromArgv(['exe', '--user-data-dir=/x.csv'], true)).toBeNull();
  });
});

describe('close prompt', () => {
  it('maps each button to its choice; Escape/close (cancelId) means cancel', () => {
    expect(closePrompt.buttons).toEqual(closeButtons.map((b) => b.label));
    expect(closeButtons.map((_, i) => closeChoice(i))).toEqual(['save', 'discard', 'cancel']);
    expect(closeChoice(closePrompt.cancelId ?? -1)).toBe('cancel');
    expect(closeChoice(99)).toBe('cancel');
  });

  it('defaults to saving, the choice that loses nothing', () => {
    expect(closeChoice(closePrompt.defaultId ?? -1)).toBe('save');
  });
});

describe('crash policy', () => {
  it('reloads after a crash, up to the limit, then gives up; a clean exit is not a crash', () => {
    const policy = createCrashPolicy(2);
    expect(policy.onGone('clean-exit')).toBe('ignore');
    expect(policy.onGone('crashed')).toBe('reload');
    expect(policy.onGone('oom')).toBe('reload');
    expect(policy.onGone('killed')).toBe('give-up');
  });
});
