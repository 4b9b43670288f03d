/**
 * The window's web preferences, item by item against the Electron "Security" tutorial checklist
 * (see checklist.ts). Electron's own defaults are not relied on: each preference must be written.
 */
import { describe, expect, it } from 'vitest';
import { reportWindowOptions, webPreferences, windowOptions } from '../../main/shell/windowOptions';
import { item } from './checklist';

const preload = '/app/dist/main/preload.cjs';
const prefs = webPreferences(preload);

describe('main window web preferences', () => {
  it(item(2, 'nodeIntegration, nodeIntegrationInWorker and nodeIntegrationInSubFrames are explicitly false'), () => {
    expect(prefs.nodeIntegration).toBe(false);
    expect(prefs.nodeIntegrationInWorker).toBe(false);
    expect(prefs.nodeIntegrationInSubFrames).toBe(false);
  });

  it(item(3, 'contextIsolation is explicitly true'), () => {
    expect(prefs.contextIsolation).toBe(true);
  });

  it(item(4, 'sandbox is explicitly true'), () => {
    expect(prefs.sandbox).toBe(true);
  });

  it(item(6, 'webSecurity is explicitly true'), () => {
    expect(prefs.webSecurity).toBe(true);
  });

  it(item(8, 'allowRunningInsecureContent is explicitly false'), () => {
    expect(prefs.allowRunningInsecureContent).toBe(false);
  });

  it(item(9, 'experimentalFeatures is explicitly false'), () => {
    expect(prefs.experimentalFeatures).toBe(false);
  });

  it(item(10, 'enableBlinkFeatures is not set at all'), () => {
    expect('enableBlinkFeatures' in prefs).toBe(false);
  });

  it(item(12, 'the <webview> tag is disabled (so items 11 and 12 have nothing to verify)'), () => {
    expect(prefs.webviewTag).toBe(false);
  });

  it(item(13, 'a file dropped on the window does not navigate the page to it'), () => {
    expect(prefs.navigateOnDragDrop).toBe(false);
  });

  it('loads the bundled preload and nothing else', () => {
    expect(prefs.preload).toBe(preload);
    expect(windowOptions(preload).webPreferences).toEqual(prefs);
  });

  it('is shown only when ready (no blank white frame)', () => {
    expect(windowOptions(preload).show).toBe(false);
  });
});

describe('report printing window', () => {
  it('runs no script, has no preload and keeps the main window sandbox settings', () => {
    const prefs = reportWindowOptions().webPreferences ?? {};
    expect(reportWindowOptions().show).toBe(false);
    expect(prefs.javascript).toBe(false);
    expect('preload' in prefs).toBe(false);
    expect(prefs).toMatchObject({ sandbox: true, contextIsolation: true, nodeIntegration: false, webSecurity: true });
  });
});
