/**
 * The one IPC table: channel name (channels.ts) → validated payload (argSchemas.ts) → service call
 * (handlers.ts, services.ts), entered through `dispatchBridgeCall` by every transport.
 */
export { bridgeMethods, channelFor, isBridgeMethod, shellChannels } from './channels';
export type { BridgeMethod, MenuCommand, PreloadApi, ShellExtras } from './channels';
export { absolutePathSchema, argNames, argSchemas, setDirtyArgsSchema } from './argSchemas';
export { describeArgIssues, dispatchBridgeCall, failure } from './dispatch';
export type { BridgeHandlers } from './dispatch';
export { createHandlersFrom } from './handlers';
export type { BridgeDeps, BridgeDialogs, BridgeServices } from './handlers';
export { createBridgeHandlers, nodeServices } from './services';
export { contentSecurityPolicy, cspDirectives, securityHeaders } from './contentSecurity';
