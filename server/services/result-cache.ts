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
 * A bounded least-recently-used cache of serialised results (byte buffers), limited by entry count,
 * total size and age. A Map keeps insertion order, so re-inserting on every hit makes its first
 * key the least recently used one, which is evicted first.
 */
export function createResultCache(options: ResultCacheOptions) {
  const now = options.now ?? Date.now;
  const entries = new Map<string, { value: Buffer; at: number }>();
  let bytes = 0;
  const drop = (key: string) => {
    const e = entries.get(key);
    if (!e) return;
    bytes -= e.value.length;
    entries.delete(key);
  };
  return {
    get(key: string): Buffer | undefined {
      const e = entries.get(key);
      if (!e) return undefined;
      drop(key);
      if (now() - e.at > options.maxAgeMs) return undefined;
      entries.set(key, e);
      bytes += e.value.length;
      return e.value;
    },
    set(key: string, value: Buffer): void {
      drop(key);
      if (value.length > options.maxBytes) return;
      entries.set(key, { value, at: now() });
      bytes += value.length;
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

export type ResultCache = ReturnType<typeof createResultCache>;
