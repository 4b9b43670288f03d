/**
 * Items of the Electron documentation's "Security" tutorial (electronjs.org/docs/latest/tutorial/security),
 * numbered as in that page's checklist. Numbering from memory of the current page; item 18's
 * number is confirmed by the link in electron-builder's FuseOptionsV1 doc comment
 * ("security.md#18-avoid-usage-of-the-file-protocol…").
 */
export const checklist = {
  1: 'Only load secure content',
  2: 'Do not enable Node.js integration for remote content',
  3: 'Enable context isolation',
  4: 'Enable process sandboxing',
  5: 'Handle session permission requests from remote content',
  6: 'Do not disable webSecurity',
  7: 'Define a Content Security Policy',
  8: 'Do not enable allowRunningInsecureContent',
  9: 'Do not enable experimental features',
  10: 'Do not use enableBlinkFeatures',
  11: 'Do not use allowpopups for WebViews',
  12: 'Verify WebView options before creation',
  13: 'Disable or limit navigation',
  14: 'Disable or limit creation of new windows',
  15: 'Do not use shell.openExternal with untrusted content',
  16: 'Use a current version of Electron',
  17: 'Validate the sender of all IPC messages',
  18: 'Avoid usage of the file:// protocol and prefer usage of custom protocols',
  19: 'Check which fuses you can change',
  20: 'Do not expose Electron APIs to untrusted web content',
} as const;

export type ChecklistItem = keyof typeof checklist;

/** Test title naming the checklist item. */
export function item(n: ChecklistItem, detail: string): string {
  return `Electron security checklist #${n} "${checklist[n]}": ${detail}`;
}
