import { describe, expect, it } from 'vitest';
import { safeReturnPath } from './auth.router.ts';

describe('safeReturnPath', () => {
  it('keeps same-site paths with their query', () => {
    expect(safeReturnPath('/labs/fernhollow/channels?range=7d')).toBe('/labs/fernhollow/channels?range=7d');
  });
  it.each<[unknown, string]>([
    ['//evil.example/x', 'protocol-relative URL'],
    ['https://evil.example/', 'absolute URL'],
    ['/\\evil.example', 'backslash trick'],
    ['', 'empty'],
    [undefined, 'missing'],
    [['/a', '/b'], 'repeated parameter'],
  ])('falls back to / for %s (%s)', (value) => {
    expect(safeReturnPath(value)).toBe('/');
  });
});
