/**
 * Who may talk to the main process and where the page may go. Pure predicates and handlers,
 * typed against Electron's own signatures but importing only its types, so tests call them
 * directly (Electron docs, "Security" tutorial: limit navigation, limit new windows, handle
 * permission requests, validate the sender of every IPC message, avoid file://).
 */
import type { HandlerDetails, WebFrameMain, WindowOpenHandlerResponse } from 'electron';
import { isAppUrl } from './appUrl';

/** The parts of a frame the sender check reads (WebFrameMain satisfies it). */
export type SenderFrame = Pick<WebFrameMain, 'url' | 'parent'>;

/**
 * An IPC message is trusted only from the top-level frame of a page served by the app itself:
 * not from an iframe (which could hold anything), not from file://, not from a frame that has
 * already gone (null).
 */
export function isTrustedSender(frame: SenderFrame | null | undefined): boolean {
  if (!frame) return false;
  if (frame.parent !== null) return false;
  return isAppUrl(frame.url);
}

/**
 * A page navigation is allowed only within the app's origin (e.g. a hash change); anything else —
 * http(s), file://, data:, javascript:, another scheme — is refused. Links meant for a browser are
 * not opened either: the app never hands a page-supplied URL to shell.openExternal.
 */
export function isNavigationAllowed(url: string): boolean {
  return isAppUrl(url);
}

/** Every window.open / target=_blank is refused. */
export function denyWindowOpen(_details: HandlerDetails): WindowOpenHandlerResponse {
  return { action: 'deny' };
}

/** Permission requests (camera, notifications, geolocation, clipboard-read …): always no. */
export function denyPermissionRequest(_webContents: unknown, _permission: string, callback: (granted: boolean) => void): void {
  callback(false);
}

/** Synchronous permission checks: always no. */
export function denyPermissionCheck(): boolean {
  return false;
}

/** The minimal event surface the guards attach to (Electron's WebContents satisfies it). */
export interface GuardableContents {
  on(event: 'will-navigate', listener: (event: { preventDefault(): void; url: string }) => void): unknown;
  on(event: 'will-frame-navigate', listener: (event: { preventDefault(): void; url: string }) => void): unknown;
  on(event: 'will-redirect', listener: (event: { preventDefault(): void; url: string }) => void): unknown;
  on(event: 'will-attach-webview', listener: (event: { preventDefault(): void }) => void): unknown;
  setWindowOpenHandler(handler: (details: HandlerDetails) => WindowOpenHandlerResponse): void;
}

/** Apply the navigation, new-window and webview guards to one webContents (called for every one). */
export function guardContents(contents: GuardableContents): void {
  const blockOutside = (event: { preventDefault(): void; url: string }): void => {
    if (!isNavigationAllowed(event.url)) event.preventDefault();
  };
  contents.on('will-navigate', blockOutside);
  contents.on('will-frame-navigate', blockOutside);
  contents.on('will-redirect', blockOutside);
  // webviewTag is off; refusing the attach as well covers a future preference change.
  contents.on('will-attach-webview', (event) => event.preventDefault());
  contents.setWindowOpenHandler(denyWindowOpen);
}
