import { describe, expect, it } from 'vitest';
import { createResultCache } from './result-cache.ts';

const bytes = (n: number) => Buffer.alloc(n, 1);

describe('createResultCache', () => {
  it('evicts the least recently used entry when over the entry limit', () => {
    const cache = createResultCache({ maxEntries: 2, maxBytes: 1000, maxAgeMs: 1000, now: () => 0 });
    cache.set('a', bytes(1));
    cache.set('b', bytes(1));
    expect(cache.get('a')).toBeDefined(); // a is now the most recent
    cache.set('c', bytes(1));
    expect(cache.get('b')).toBeUndefined();
    expect(cache.get('a')).toBeDefined();
    expect(cache.get('c')).toBeDefined();
    expect(cache.size).toBe(2);
  });

  it('evicts by total size and refuses an entry larger than the whole budget', () => {
    const cache = createResultCache({ maxEntries: 10, maxBytes: 100, maxAgeMs: 1000, now: () => 0 });
    cache.set('a', bytes(60));
    cache.set('b', bytes(30));
    cache.set('c', bytes(30));
    expect(cache.get('a')).toBeUndefined();
    expect(cache.get('b')?.length).toBe(30);
    cache.set('huge', bytes(101));
    expect(cache.get('huge')).toBeUndefined();
    expect(cache.size).toBe(2);
  });

  it('never serves an entry older than maxAgeMs, and replacing a key keeps one entry', () => {
    let clock = 0;
    const cache = createResultCache({ maxEntries: 10, maxBytes: 100, maxAgeMs: 50, now: () => clock });
    cache.set('a', bytes(1));
    cache.set('a', bytes(2));
    expect(cache.size).toBe(1);
    clock = 50;
    expect(cache.get('a')?.length).toBe(2);
    clock = 51;
    expect(cache.get('a')).toBeUndefined();
    expect(cache.size).toBe(0);
  });
});

describe('createResultCache with sizeOf', () => {
  it('budgets any value by the size it reports', () => {
    const cache = createResultCache<Float64Array>({ maxEntries: 10, maxBytes: 100, maxAgeMs: 1000, now: () => 0, sizeOf: (v) => v.byteLength });
    cache.set('a', new Float64Array(6)); // 48 bytes
    cache.set('b', new Float64Array(6)); // 96 in all
    cache.set('c', new Float64Array(2)); // 112: 'a' goes
    expect(cache.get('a')).toBeUndefined();
    expect(cache.get('b')?.length).toBe(6);
    expect(cache.get('c')?.length).toBe(2);
    cache.set('huge', new Float64Array(13)); // 104 bytes, more than the whole budget
    expect(cache.get('huge')).toBeUndefined();
    expect(cache.size).toBe(2);
  });
});
