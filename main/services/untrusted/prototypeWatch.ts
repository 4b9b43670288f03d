/**
 * Notices any change to the built-in prototypes: a key added, removed or given another value.
 * Used inside the parsing worker after every job (a polluted worker is discarded together with
 * its result) and by the fuzz tests in the test process.
 */
const WATCHED: readonly (readonly [string, object])[] = [
  ['Object.prototype', Object.prototype],
  ['Array.prototype', Array.prototype],
  ['Function.prototype', Function.prototype],
  ['String.prototype', String.prototype],
];

type Snapshot = ReadonlyMap<string, PropertyDescriptor>;

export interface PrototypeWatch {
  /** "Object.prototype.polluted (added)" … for every difference from the snapshot; empty if none. */
  changes(): string[];
}

export function watchPrototypes(): PrototypeWatch {
  const before = WATCHED.map(([label, proto]) => [label, proto, snapshot(proto)] as const);
  return {
    changes() {
      const out: string[] = [];
      for (const [label, proto, snap] of before) {
        const now = snapshot(proto);
        for (const [key, d] of now) {
          const old = snap.get(key);
          if (old === undefined) out.push(`${label}.${key} (added)`);
          else if (old.value !== d.value || old.get !== d.get || old.set !== d.set) out.push(`${label}.${key} (changed)`);
        }
        for (const key of snap.keys()) if (!now.has(key)) out.push(`${label}.${key} (removed)`);
      }
      return out;
    },
  };
}

function snapshot(proto: object): Snapshot {
  const map = new Map<string, PropertyDescriptor>();
  for (const key of Reflect.ownKeys(proto)) {
    const d = Object.getOwnPropertyDescriptor(proto, key);
    if (d !== undefined) map.set(typeof key === 'symbol' ? key.toString() : key, d);
  }
  return map;
}
