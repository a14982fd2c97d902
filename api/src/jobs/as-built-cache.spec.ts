import { describe, expect, it } from 'vitest';

import { DEFAULT_DEPTH_RULES } from '../domain/depth/depth-rules.js';
import { AS_BUILT_CACHE_ENTRIES, AsBuiltCache, type AsBuiltPart, spliceAsBuiltAnswer } from './as-built-cache.js';

const part = (n: number) => ({ asBuilt: { n }, analysis: {}, records: {} }) as unknown as AsBuiltPart;

describe('AsBuiltCache', () => {
  it('should key by job, job version, site version and depth rule table', () => {
    const base = AsBuiltCache.key('job-1', 3, 7, undefined);
    expect(AsBuiltCache.key('job-1', 4, 7, undefined)).not.toBe(base);
    expect(AsBuiltCache.key('job-1', 3, 8, undefined)).not.toBe(base);
    expect(AsBuiltCache.key('job-2', 3, 7, undefined)).not.toBe(base);
    expect(AsBuiltCache.key('job-1', 3, 7, DEFAULT_DEPTH_RULES)).not.toBe(base);
    expect(AsBuiltCache.key('job-1', 3, 7, structuredClone(DEFAULT_DEPTH_RULES))).toBe(AsBuiltCache.key('job-1', 3, 7, DEFAULT_DEPTH_RULES));
  });

  it('should keep the encoded part, to splice after the job', () => {
    const cache = new AsBuiltCache();
    const entry = cache.set('k', part(1));
    expect(JSON.parse(spliceAsBuiltAnswer('null', entry).toString('utf8'))).toEqual({ job: null, ...part(1) });
    expect(cache.get('k')).toBe(entry);
  });

  it('should splice an answer whose bytes are the UTF-8 of the whole answer, names outside Latin-1 included', () => {
    const named = { asBuilt: { zones: [{ name: 'Patio – east ✓ 東' }] }, analysis: { note: 'ø 4¼' }, records: {} } as unknown as AsBuiltPart;
    const job = { title: 'Back-yard “sound” — 2nd', id: 'j-1' };
    const entry = new AsBuiltCache().set('k', named);
    const bytes = spliceAsBuiltAnswer(JSON.stringify(job), entry);
    expect(bytes.equals(Buffer.from(JSON.stringify({ job, ...named }), 'utf8'))).toBe(true);
    expect(JSON.parse(bytes.toString('utf8'))).toEqual({ job, ...named });
  });

  it('should drop the least recently used entry past its capacity', () => {
    const cache = new AsBuiltCache();
    for (let i = 0; i < AS_BUILT_CACHE_ENTRIES; i += 1) cache.set(`k${i}`, part(i));
    cache.get('k0'); // used: k1 is now the oldest
    cache.set('new', part(-1));
    expect(cache.size).toBe(AS_BUILT_CACHE_ENTRIES);
    expect(cache.get('k0')).toBeDefined();
    expect(cache.get('k1')).toBeUndefined();
    expect(cache.get('new')).toBeDefined();
  });
});
