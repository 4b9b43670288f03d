import { z } from 'zod';
import { describe, expect, it } from 'vitest';
import { parseVersioned, planMigrations, projectMigrations, PLAN_SCHEMA_VERSION, PROJECT_SCHEMA_VERSION, type VersionedFormat } from '../../../main/services/project';

// A format of the test's own with three schema versions, to exercise the migration mechanism:
// v0 stored `{ name }`, v1 renamed it to `{ title }`, v2 added `{ tags }`.
const v2Schema = z.strictObject({ format: z.literal('test-doc'), schemaVersion: z.literal(2), title: z.string(), tags: z.array(z.string()) });
const spec: VersionedFormat<z.output<typeof v2Schema>> = {
  format: 'test-doc',
  label: 'test file',
  currentVersion: 2,
  schema: v2Schema,
  migrations: {
    0: (old) => {
      const o = z.looseObject({ name: z.string() }).parse(old);
      const { name, ...rest } = o;
      return { ...rest, schemaVersion: 1, title: name };
    },
    1: (old) => ({ ...(old as object), schemaVersion: 2, tags: [] }),
  },
};

describe('versioned files: migration mechanism', () => {
  it('upgrades a document one version at a time', () => {
    const r = parseVersioned('{"format":"test-doc","schemaVersion":0,"name":"Old"}', spec);
    expect(r).toEqual({ ok: true, value: { document: { format: 'test-doc', schemaVersion: 2, title: 'Old', tags: [] }, migratedFrom: 0 } });
    const current = parseVersioned('{"format":"test-doc","schemaVersion":2,"title":"New","tags":["x"]}', spec);
    expect(current.ok && current.value.migratedFrom).toBe(null);
  });

  it('reports a failing migration as damaged, naming the versions', () => {
    const r = parseVersioned('{"format":"test-doc","schemaVersion":0,"name":5}', spec);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.code).toBe('damaged');
      expect(r.message).toContain('from file schema 0 to 1');
    }
  });

  it('reports a version without an upgrade path', () => {
    const gap: VersionedFormat<unknown> = { ...spec, migrations: { 1: spec.migrations[1]! } };
    const r = parseVersioned('{"format":"test-doc","schemaVersion":0,"name":"x"}', gap);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toContain('file schema 0, which this version of Weighbridge cannot upgrade');
  });

  it('the real tables have one step for every version below the current one, and no others', () => {
    // Version 1 is the first schema of both files, so today both tables are empty; this guards later versions.
    const tables = [[projectMigrations, PROJECT_SCHEMA_VERSION], [planMigrations, PLAN_SCHEMA_VERSION]] as const;
    for (const [table, current] of tables) {
      for (let v = 1; v < current; v += 1) expect(table[v]).toBeTypeOf('function');
      expect(Object.keys(table).map(Number).every((k) => k >= 1 && k < current)).toBe(true);
    }
  });
});
