/**
 * The main window's options. Every security-relevant web preference is written out, even where
 * it equals Electron's default, so that a default changing upstream cannot weaken the app
 * silently and so that the tests can assert each one (Electron docs, "Security" tutorial).
 */
import type { BrowserWindowConstructorOptions, WebPreferences } from 'electron';

export function webPreferences(preloadPath: string): WebPreferences {
  return {
    preload: preloadPath,
    sandbox: true,
    contextIsolation: true,
    nodeIntegration: false,
    nodeIntegrationInWorker: false,
    nodeIntegrationInSubFrames: false,
    webSecurity: true,
    allowRunningInsecureContent: false,
    experimentalFeatures: false,
    webviewTag: false,
    navigateOnDragDrop: false,
    spellcheck: false,
    // enableBlinkFeatures is deliberately absent: no extra Blink features.
  };
}

export function windowOptions(preloadPath: string): BrowserWindowConstructorOptions {
  return {
    width: 1280,
    height: 820,
    minWidth: 900,
    minHeight: 600,
    title: 'Weighbridge',
    // Shown on 'ready-to-show' so the user never sees an empty white frame.
    show: false,
    webPreferences: webPreferences(preloadPath),
  };
}

/**
 * The hidden window that prints the report to PDF: the page is self-contained HTML with no script,
 * so JavaScript is off, there is no preload, and it gets the same sandbox as the main window.
 */
export function reportWindowOptions(): BrowserWindowConstructorOptions {
  const { preload: _none, ...prefs } = webPreferences('');
  return { show: false, width: 794, height: 1123, webPreferences: { ...prefs, javascript: false, images: true } };
}
