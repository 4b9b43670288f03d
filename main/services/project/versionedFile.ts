/**
 * The one mechanism behind every Weighbridge JSON file (project, plan, recovery): an envelope
 * `{ format, schemaVersion, …payload }`, a migration table that upgrades an older document one
 * version at a time, and a strict schema for the current version. A file is either fully valid
 * after migration or refused — never half-loaded.
 *
 * Failure codes: 'bad-input' (not this kind of file), 'newer-schema' (written by a newer version
 * of the program), 'damaged' (not JSON, or a field fails validation; the message carries the
 * field's path).
 */
import { z } from 'zod';
import type { Result } from '../../../renderer/bridge/contract';
import { describeIssues } from '../schemas';
import { fail, ok } from './result';

/** Upgrades a whole document from version n (the table key) to version n + 1. */
export type Migration = (old: unknown) => unknown;

export interface VersionedFormat<T> {
  /** The `format` marker written into the file. */
  readonly format: string;
  /** What the user calls this file, for messages ("project file", "plan file"). */
  readonly label: string;
  readonly currentVersion: number;
  /** `migrations[n]` turns a version-n document into a version-(n + 1) document. */
  readonly migrations: Readonly<Record<number, Migration>>;
  /** Strict schema of the whole current-version document. */
  readonly schema: z.ZodType<T>;
  /** Other formats we know, so a wrong pick gets a helpful message. */
  readonly otherFormats?: Readonly<Record<string, string>>;
}

const RESERVED_KEYS = new Set(['__proto__']);

const headSchema = z.looseObject({
  format: z.string(),
  schemaVersion: z.number().int().nonnegative(),
});

export interface ParsedDocument<T> {
  readonly document: T;
  /** The version the file was written in, when it was migrated; null when already current. */
  readonly migratedFrom: number | null;
}

/** Parse and validate the text of a versioned file, migrating older versions first. */
export function parseVersioned<T>(text: string, spec: VersionedFormat<T>, name = `this ${spec.label}`): Result<ParsedDocument<T>> {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  let raw: unknown;
  let reservedKey: string | null = null;
  try {
    // zod drops a `__proto__` key silently; a file carrying one was not written by us, so refuse it.
    raw = JSON.parse(body, (key, value: unknown) => {
      if (RESERVED_KEYS.has(key) && reservedKey === null) reservedKey = key;
      return value;
    });
  } catch (error) {
    const detail = error instanceof Error ? error.message : String(error);
    return fail('damaged', `${name} is damaged and was not opened: it is not valid JSON (${detail}). The file was not changed; open its backup (.bak) if there is one.`);
  }
  if (reservedKey !== null) {
    return fail('damaged', `${name} is damaged and was not opened: it contains a field named "${reservedKey}", which Weighbridge never writes. The file was not changed.`);
  }
  const head = headSchema.safeParse(raw);
  if (!head.success) {
    return fail('bad-input', `${name} is not a Weighbridge ${spec.label}: it has no "format" and "schemaVersion" fields. Choose a file saved by Weighbridge.`);
  }
  const { format, schemaVersion } = head.data;
  if (format !== spec.format) {
    const other = spec.otherFormats?.[format];
    const hint = other ? ` It is a ${other}; open it as one.` : ' Choose a file saved by Weighbridge.';
    return fail('bad-input', `${name} is not a Weighbridge ${spec.label} (its format is "${format}").${hint}`);
  }
  if (schemaVersion > spec.currentVersion) {
    return fail(
      'newer-schema',
      `${name} was saved by a newer version of Weighbridge (file schema ${schemaVersion}; this version reads up to ${spec.currentVersion}). Open it with a newer Weighbridge. The file was not changed.`,
    );
  }
  let doc: unknown = raw;
  for (let v = schemaVersion; v < spec.currentVersion; v += 1) {
    const step = spec.migrations[v];
    if (!step) {
      return fail('damaged', `${name} uses file schema ${v}, which this version of Weighbridge cannot upgrade. The file was not changed.`);
    }
    try {
      doc = step(doc);
    } catch (error) {
      const detail = error instanceof Error ? error.message : String(error);
      return fail('damaged', `${name} could not be upgraded from file schema ${v} to ${v + 1}: ${detail}. The file was not changed.`);
    }
  }
  const parsed = spec.schema.safeParse(doc);
  if (!parsed.success) {
    return fail('damaged', `${name} is damaged and was not opened: ${describeIssues(parsed.error)}. The file was not changed; open its backup (.bak) if there is one.`);
  }
  return ok({ document: parsed.data, migratedFrom: schemaVersion === spec.currentVersion ? null : schemaVersion });
}

/** Files larger than this are refused before reading: no course comes near it, a wrong pick might. */
export const MAX_JSON_FILE_BYTES = 256 * 1024 * 1024;
