/** Limits of a {@link createResultCache}. */
export interface ResultCacheOptions {
  /** Most entries kept. */
  maxEntries: number;
  /** Most bytes kept over all entries. */
  maxBytes: number;
  /** An entry older than this is never served. */
  maxAgeMs: number;
  now?: () => number;
}

/**
 * A bounded least-recently-used cache of results — serialised answers (byte buffers) by
 * default, or any value whose size `sizeOf` tells — limited by entry count, total size and age.
 * A Map keeps insertion order, so re-inserting on every hit makes its first key the least
 * recently used one, which is evicted first.
 */
export function createResultCache<V = Buffer>(options: ResultCacheOptions & { sizeOf?: (value: V) => number }) {
  const now = options.now ?? Date.now;
  const sizeOf = options.sizeOf ?? ((value: V) => (value as Buffer).length);
  const entries = new Map<string, { value: V; size: number; at: number }>();
  let bytes = 0;
  const drop = (key: string) => {
    const e = entries.get(key);
    if (!e) return;
    bytes -= e.size;
    entries.delete(key);
  };
  return {
    get(key: string): V | undefined {
      const e = entries.get(key);
      if (!e) return undefined;
      drop(key);
      if (now() - e.at > options.maxAgeMs) return undefined;
      entries.set(key, e);
      bytes += e.size;
      return e.value;
    },
    set(key: string, value: V): void {
      drop(key);
      const size = sizeOf(value);
      if (size > options.maxBytes) return;
      entries.set(key, { value, size, at: now() });
      bytes += size;
      for (const oldest of entries.keys()) {
        if (entries.size <= options.maxEntries && bytes <= options.maxBytes) break;
        drop(oldest);
      }
    },
    get size(): number {
      return entries.size;
    },
  };
}

export type ResultCache<V = Buffer> = ReturnType<typeof createResultCache<V>>;
