import type { WindowBridge } from './extras';

declare global {
  interface Window {
    /** Set by the Electron preload (contextBridge) or by the browser harness's bridge script. */
    readonly weighbridge?: WindowBridge;
  }
}

export {};
