import { describe, expect, it } from 'vitest';
import { ModelCache } from './modelCache';

describe('ModelCache', () => {
  it('returns a value only for the exact version and settings generation it was stored with', () => {
    const cache = new ModelCache<string>();
    cache.set('a', 2, 0, 'v2');
    expect(cache.get('a', 2, 0)).toBe('v2');
    expect(cache.get('a', 1, 0)).toBeUndefined();
    expect(cache.get('a', 3, 0)).toBeUndefined();
    expect(cache.get('a', 2, 1)).toBeUndefined();
  });

  it('keeps the newest version when an older analysis finishes late', () => {
    const cache = new ModelCache<string>();
    cache.set('a', 3, 0, 'v3');
    cache.set('a', 2, 0, 'v2');
    expect(cache.get('a', 3, 0)).toBe('v3');
  });

  it('holds one entry per document and forgets on delete and clear', () => {
    const cache = new ModelCache<string>();
    cache.set('a', 1, 0, 'a1');
    cache.set('a', 2, 0, 'a2');
    cache.set('b', 1, 0, 'b1');
    expect(cache.size).toBe(2);
    cache.delete('a');
    expect(cache.get('a', 2, 0)).toBeUndefined();
    cache.clear();
    expect(cache.size).toBe(0);
  });
});
