/**
 * Binds the IPC table to Electron's ipcMain: one `handle` per bridge method, each checking the
 * sender frame before the payload reaches `dispatchBridgeCall` (Electron docs, "Security"
 * tutorial: "Validate the sender of all IPC messages"). Typed against ipcMain's own signature
 * but taking it as an argument, so tests pass a recorder instead of Electron.
 */
import type { IpcMainInvokeEvent } from 'electron';
import type { Failure, Result } from '../../renderer/bridge/contract';
import { printReportArgsSchema, setDirtyArgsSchema } from '../ipc/argSchemas';
import { bridgeMethods, channelFor, shellChannels } from '../ipc/channels';
import { dispatchBridgeCall, failure, type BridgeHandlers } from '../ipc/dispatch';
import { isTrustedSender, type SenderFrame } from './guards';

/** What of ipcMain this needs (Electron's IpcMain satisfies it). */
export interface IpcMainLike {
  handle(channel: string, listener: (event: IpcMainInvokeEvent, ...args: unknown[]) => Promise<unknown> | unknown): void;
}

/** The event fields the checks read (IpcMainInvokeEvent satisfies it). */
export interface InvokeEventLike {
  readonly senderFrame: SenderFrame | null;
  readonly sender: { readonly id: number };
}

export const untrustedSender: Failure = failure('untrusted-sender', 'This request did not come from the Weighbridge window and was refused.');

/** The body of each bridge-method handler: sender check, then the shared dispatcher. */
export async function handleBridgeInvoke(handlers: BridgeHandlers, method: string, event: InvokeEventLike, args: unknown[]): Promise<Result<unknown>> {
  if (!isTrustedSender(event.senderFrame)) return untrustedSender;
  return dispatchBridgeCall(handlers, method, args);
}

export interface ShellIpcOptions {
  /** `wb:setDirty` from a trusted sender: the window's unsaved-changes flag. */
  onSetDirty(senderId: number, dirty: boolean): void;
  /** `wb:printReportToPdf` from a trusted sender, arguments validated: print the page and save it. */
  printReportToPdf(html: string, path: string): Promise<Result<{ path: string }>>;
}

/** Register every bridge channel plus the shell's own channels. Returns the channels registered. */
export function registerIpc(ipcMain: IpcMainLike, handlers: BridgeHandlers, options: ShellIpcOptions): string[] {
  const channels: string[] = [];
  for (const method of bridgeMethods) {
    const channel = channelFor(method);
    ipcMain.handle(channel, (event, ...args) => handleBridgeInvoke(handlers, method, event, args));
    channels.push(channel);
  }
  ipcMain.handle(shellChannels.setDirty, (event, ...args): Result<null> => {
    if (!isTrustedSender(event.senderFrame)) return untrustedSender;
    const parsed = setDirtyArgsSchema.safeParse(args);
    if (!parsed.success) return failure('bad-payload', 'setDirty takes one true/false argument.');
    options.onSetDirty(event.sender.id, parsed.data[0]);
    return { ok: true, value: null };
  });
  channels.push(shellChannels.setDirty);
  ipcMain.handle(shellChannels.printReportToPdf, async (event, ...args): Promise<Result<{ path: string }>> => {
    if (!isTrustedSender(event.senderFrame)) return untrustedSender;
    const parsed = printReportArgsSchema.safeParse(args);
    if (!parsed.success) return failure('bad-payload', 'printReportToPdf takes the report page (text) and the full path of a .pdf file.');
    return options.printReportToPdf(parsed.data[0], parsed.data[1]);
  });
  channels.push(shellChannels.printReportToPdf);
  return channels;
}
