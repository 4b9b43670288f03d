/**
 * The renderer reaches the machine only through the bridge in this context. Components call
 * `useBridge()` instead of touching `window.weighbridge`, so tests and the harness can supply any
 * implementation of the contract.
 */
import { createContext, useContext, type ReactNode } from 'react';
import type { WindowBridge } from './extras';

const BridgeContext = createContext<WindowBridge | null>(null);

export function BridgeProvider({ bridge, children }: { bridge: WindowBridge; children: ReactNode }) {
  return <BridgeContext.Provider value={bridge}>{children}</BridgeContext.Provider>;
}

export function useBridge(): WindowBridge {
  const bridge = useContext(BridgeContext);
  if (bridge === null) throw new Error('useBridge() needs a <BridgeProvider> above it');
  return bridge;
}
