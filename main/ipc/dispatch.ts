/**
 * The one entry point for a call from the renderer, whatever the transport: the Electron
 * `ipcMain.handle` callbacks (main/shell) and the browser harness's loopback server both end here,
 * so both refuse the same things in the same words.
 *
 * Order of checks: known method → argument schema → handler. A handler that throws is turned into
 * a Failure carrying the message only: a stack trace names files and lines of the machine, which
 * the page has no business seeing.
 */
import type { z } from 'zod';
import type { DesktopBridge, Failure, Result } from '../../renderer/bridge/contract';
import { formatPath } from '../services/schemas';
import { argNames, argSchemas } from './argSchemas';
import { isBridgeMethod, type BridgeMethod } from './channels';

/** One async function per bridge method, with the contract's own signature. */
export type BridgeHandlers = {
  readonly [M in BridgeMethod]: (...args: Parameters<DesktopBridge[M]>) => ReturnType<DesktopBridge[M]>;
};

export function failure(code: string, message: string): Failure {
  return { ok: false, code, message };
}

/** "path: message" for each issue, with the argument's name in place of its index. */
export function describeArgIssues(method: BridgeMethod, error: z.ZodError, max = 5): string {
  const names = argNames[method];
  const lines = error.issues.slice(0, max).map((issue) => {
    const [head, ...rest] = issue.path;
    const named = typeof head === 'number' && names[head] !== undefined ? [names[head], ...rest] : issue.path;
    return `${formatPath(named)}: ${issue.message}`;
  });
  const more = error.issues.length > max ? ` (and ${error.issues.length - max} more)` : '';
  return lines.join('; ') + more;
}

async function callHandler<M extends BridgeMethod>(handlers: BridgeHandlers, method: M, args: unknown): Promise<Result<unknown>> {
  const schema: z.ZodType<Parameters<DesktopBridge[M]>> = argSchemas[method];
  const parsed = schema.safeParse(args);
  if (!parsed.success) {
    return failure('bad-payload', `The request ${method} was refused: ${describeArgIssues(method, parsed.error)}.`);
  }
  const handler: (...a: Parameters<DesktopBridge[M]>) => ReturnType<DesktopBridge[M]> = handlers[method];
  return await handler(...parsed.data);
}

/**
 * Validate and run one call. Never throws; always resolves to a Result.
 * @param method the bridge method name (the channel without its 'wb:' prefix)
 * @param args the argument list exactly as received (an array over IPC)
 */
export async function dispatchBridgeCall(handlers: BridgeHandlers, method: string, args: unknown): Promise<Result<unknown>> {
  if (!isBridgeMethod(method)) {
    return failure('unknown-method', `There is no request named "${method.slice(0, 80)}".`);
  }
  if (!Array.isArray(args)) {
    return failure('bad-payload', `The request ${method} was refused: its arguments must be a list.`);
  }
  try {
    return await callHandler(handlers, method, args);
  } catch (error) {
    const message = error instanceof Error ? error.message : 'An unexpected error occurred.';
    return failure('internal', `${method} failed: ${message}`);
  }
}
