/**
 * A value that may be "not defined" for a stated reason (n = 0, n = 1, zero mean for CV, …).
 * The engine never returns NaN and never invents a 0: callers must look at `defined`.
 */
export type Defined<T> =
  | { readonly defined: true; readonly value: T }
  | { readonly defined: false; readonly reason: string };

export function defined<T>(value: T): Defined<T> {
  return { defined: true, value };
}

export function notDefined(reason: string): Defined<never> {
  return { defined: false, reason };
}

/** The value, or null when not defined (for JSON output, where the reason goes to `notes`). */
export function valueOrNull<T>(d: Defined<T>): T | null {
  return d.defined ? d.value : null;
}
