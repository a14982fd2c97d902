import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';

import { isApiError } from '../../../lib/api-client';
import { rememberUser } from '../../../lib/offline-user';
import { getSessionState, resetSession } from '../../../lib/session';
import { buildSessionUser } from '../../../testing/data';

import { restoreSession } from './restore-session';

describe('restoreSession with no signal (issue 17)', () => {
  beforeEach(() => {
    localStorage.clear();
    resetSession();
    vi.stubGlobal('fetch', vi.fn(() => Promise.reject(new TypeError('Failed to fetch'))));
  });
  afterEach(() => {
    vi.unstubAllGlobals();
    resetSession();
  });

  it('should open the app offline for the person last signed in here, with no access token', async () => {
    const lead = buildSessionUser('lead');
    rememberUser(lead);
    await expect(restoreSession()).resolves.toEqual(lead);
    const state = getSessionState();
    expect(state.status).toBe('signed-in');
    expect(state.status === 'signed-in' && state.session.offline).toBe(true);
    expect(state.status === 'signed-in' && state.session.accessToken).toBe('');
  });

  it('should still say the server cannot be reached when nobody was signed in on this device', async () => {
    const error = await restoreSession().catch((caught: unknown) => caught);
    expect(isApiError(error) && error.status).toBe(0);
    expect(getSessionState().status).toBe('unknown');
  });
});
