/**
 * What the renderer sees on `window.weighbridge`: the DesktopBridge plus the shell extras, each
 * optional because the browser harness provides none of them — the UI must work without each one.
 */
import type { DesktopBridge, MenuCommand, ShellExtras } from './contract';

export type { MenuCommand };

export type BridgeExtras = Partial<ShellExtras>;

/** The object on `window.weighbridge`. */
export type WindowBridge = DesktopBridge & BridgeExtras;
