import { afterEach, describe, expect, it, vi } from 'vitest';

// @ts-expect-error -- plain ESM script shared with `npm start`; no type declarations.
import { demoSeedDecision, seedDemoUnlessDisabled } from '../../scripts/lib/seed.mjs';

// The demo company's password is published in the README: `npm start` must not seed it into a
// production database unless asked to, and LOAMLINE_SEED_DEMO=0 turns it off anywhere.
describe('demo seed safety (scripts/lib/seed.mjs)', () => {
  afterEach(() => {
    vi.restoreAllMocks();
  });

  it.each([
    [{}, true],
    [{ NODE_ENV: 'development' }, true],
    [{ NODE_ENV: 'test' }, true],
    [{ NODE_ENV: 'production' }, false],
    [{ NODE_ENV: 'production', LOAMLINE_SEED_DEMO: '1' }, true],
    [{ NODE_ENV: 'production', LOAMLINE_SEED_DEMO: '0' }, false],
    [{ NODE_ENV: 'development', LOAMLINE_SEED_DEMO: '0' }, false],
    [{ LOAMLINE_SEED_DEMO: '0' }, false],
    [{ LOAMLINE_SEED_DEMO: '1' }, true],
    [{ LOAMLINE_SEED_DEMO: '' }, true],
  ])('should decide %j → seed %s', (env, seed) => {
    expect(demoSeedDecision(env).seed).toBe(seed);
  });

  it('should refuse a value other than 1 or 0, naming the variable', () => {
    expect(() => demoSeedDecision({ LOAMLINE_SEED_DEMO: 'yes' })).toThrow(/LOAMLINE_SEED_DEMO must be 1 .* or 0/);
  });

  it('should log why it skipped, without touching the database, under NODE_ENV=production', async () => {
    const logged = vi.spyOn(console, 'log').mockImplementation(() => undefined);
    // An unreachable database: seeding would fail, so skipping must not even connect.
    const result = await seedDemoUnlessDisabled('postgres://nobody@127.0.0.1:1/none', { NODE_ENV: 'production' });
    expect(result).toEqual({ lines: [] });
    expect(logged).toHaveBeenCalledWith(expect.stringMatching(/demo seed skipped: NODE_ENV=production .*LOAMLINE_SEED_DEMO=1/));
  });
});
