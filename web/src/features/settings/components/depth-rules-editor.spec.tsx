import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { CompanyDepthRulesResponse, UpdateDepthRulesInput } from '@domain/company/company-profile.schema';
import { DEFAULT_DEPTH_RULES } from '@domain/depth/depth-rules';

import { buildSessionUser } from '../../../testing/data';
import { mockApi, type MockRequest } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';
import { IMPERIAL_PREFERENCES, IMPERIAL_SETTINGS } from '../testing-fixtures';


describe('Depth rules editor', () => {
  it('should give each circuit class of a method and location its own field, and change only the rule typed into', async () => {
    const puts: MockRequest[] = [];
    let current: CompanyDepthRulesResponse = { table: DEFAULT_DEPTH_RULES, isDefault: true, defaults: DEFAULT_DEPTH_RULES };
    mockApi({
      'GET /api/company/settings': () => jsonResponse(IMPERIAL_SETTINGS),
      'GET /api/me/preferences': () => jsonResponse(IMPERIAL_PREFERENCES),
      'GET /api/company/profile': () => jsonResponse({}, 404),
      'GET /api/company/depth-rules': () => jsonResponse(current),
      'PUT /api/company/depth-rules': (request) => {
        puts.push(request);
        current = { table: request.body as CompanyDepthRulesResponse['table'], isDefault: false, defaults: DEFAULT_DEPTH_RULES };
        return jsonResponse(current);
      },
    });
    const { user } = renderApp({ url: '/settings', signedInAs: buildSessionUser('admin') });
    const list = await screen.findByRole('list', { name: 'Depth rules' }, { timeout: 30_000 });

    // The shipped table has a rule for circuits up to 30 V and one for circuits over 30 V per place.
    const low = within(list).getByRole('textbox', { name: /^Minimum cover, Direct burial, lawn, beds, anywhere else, circuits up to 30 V$/ });
    const high = within(list).getByRole('textbox', { name: /^Minimum cover, Direct burial, lawn, beds, anywhere else, circuits over 30 V/ });
    const lowBefore = (low as HTMLInputElement).value;
    expect((high as HTMLInputElement).value).not.toBe(lowBefore);
    expect(within(list).getAllByRole('textbox')).toHaveLength(DEFAULT_DEPTH_RULES.rules.length);

    await user.clear(high);
    await user.type(high, '30');
    expect(low).toHaveValue(lowBefore);
    await user.click(screen.getByRole('button', { name: 'Save depth rules' }));

    await waitFor(() => expect(puts).toHaveLength(1));
    const sent = (puts[0]!.body as UpdateDepthRulesInput).rules;
    // Compared field by field (the answer's fields may come in another order).
    const same = (a: object, b: object) => JSON.stringify(Object.entries(a).sort()) === JSON.stringify(Object.entries(b).sort());
    const changed = sent.filter((rule, i) => !same(rule, DEFAULT_DEPTH_RULES.rules[i]!));
    // 30 in = 0.762 m: 1 in is exactly 25.4 mm (international yard and pound agreement, 1959; NIST SP 811 B.8).
    expect(changed).toEqual([expect.objectContaining({ method: 'direct_burial', location: 'general', circuit: 'over_30v', minCoverM: 0.762, basis: 'company' })]);
  }, 60_000);
});
