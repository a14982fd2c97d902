import { screen, waitFor, within } from '@testing-library/react';
import { beforeEach, describe, expect, it } from 'vitest';

import { buildSessionUser } from '../../../testing/data';
import { buildAsBuilt, buildJobAsBuilt, JOB_IDS } from '../../../testing/job-data';
import { apiErrorResponse, mockApi, type MockRequest } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';

const AS_BUILT = `GET /api/jobs/${JOB_IDS.job}/as-built`;
const JOB_URL = `/jobs/${JOB_IDS.job}`;

describe('Job forms kept as drafts (react-hook-form)', () => {
  beforeEach(() => localStorage.clear());

  it('should keep typed notes across a remount, map the server’s field error, and drop the draft once saved', async () => {
    const patches: MockRequest[] = [];
    mockApi({
      [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(buildAsBuilt())),
      [`PATCH /api/jobs/${JOB_IDS.job}`]: (request) => {
        patches.push(request);
        if (patches.length === 1) {
          return apiErrorResponse(400, { message: 'notes: too long', code: 'VALIDATION_FAILED', issues: [{ path: 'notes', message: 'too long for the packet' }] });
        }
        return jsonResponse({ ...buildJobAsBuilt().job, notes: 'Gate code 4411', version: 4 });
      },
    });
    const first = renderApp({ url: `${JOB_URL}?section=notes`, signedInAs: buildSessionUser('lead') });
    await first.user.type(await screen.findByLabelText(/Notes for the office/, undefined, { timeout: 10_000 }), 'Gate code 4411');
    expect(screen.getByText('Not saved yet.')).toBeInTheDocument();
    first.unmount();

    const second = renderApp({ url: `${JOB_URL}?section=notes`, signedInAs: buildSessionUser('lead') });
    const notes = await screen.findByLabelText(/Notes for the office/, undefined, { timeout: 10_000 });
    expect(notes).toHaveValue('Gate code 4411');
    await second.user.click(screen.getByRole('button', { name: 'Save notes' }));
    expect(await screen.findByText('Too long for the packet.', undefined, { timeout: 10_000 })).toBeInTheDocument();
    expect(patches[0]!.body).toEqual({ notes: 'Gate code 4411' });
    expect(patches[0]!.headers.get('If-Match')).toBe('"3"');

    await second.user.click(screen.getByRole('button', { name: 'Save notes' }));
    await waitFor(() => expect(patches).toHaveLength(2));
    await waitFor(() => expect(screen.queryByText('Not saved yet.')).not.toBeInTheDocument());
    expect(Object.keys(localStorage).filter((key) => key.startsWith('loamline.draft.'))).toEqual([]);
  }, 30_000);

  it('should check a new zone against the shared schema before sending, then send it and empty the field', async () => {
    const posts: MockRequest[] = [];
    let asBuilt = buildAsBuilt();
    mockApi({
      [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(asBuilt, { version: 3 + posts.length })),
      [`POST /api/jobs/${JOB_IDS.job}/zones`]: (request) => {
        posts.push(request);
        asBuilt = { ...asBuilt, zones: [{ id: '7d1e2f30-1111-4a4a-9b9b-0000000000a1', name: 'Patio' }] };
        return jsonResponse({ zone: asBuilt.zones[0], jobVersion: 4 });
      },
    });
    const { user } = renderApp({ url: `${JOB_URL}?section=zones`, signedInAs: buildSessionUser('lead') });
    await user.click(await screen.findByRole('button', { name: 'Add zone' }, { timeout: 10_000 }));
    expect(await screen.findByText('Enter a name.', undefined, { timeout: 10_000 })).toBeInTheDocument();
    expect(posts).toHaveLength(0);

    await user.type(screen.getByLabelText('New zone'), 'Patio');
    await user.click(screen.getByRole('button', { name: 'Add zone' }));
    await waitFor(() => expect(posts).toHaveLength(1));
    expect(posts[0]!.body).toEqual({ name: 'Patio' });
    const zones = await screen.findByRole('list', { name: 'Zones' }, { timeout: 10_000 });
    expect(within(zones).getByText('Patio')).toBeInTheDocument();
    await waitFor(() => expect(screen.getByLabelText('New zone')).toHaveValue(''));
  }, 30_000);

  it('should check a commissioning reading before sending and send the shared schema’s shape without an id', async () => {
    const posts: MockRequest[] = [];
    mockApi({
      [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(buildAsBuilt())),
      [`POST /api/jobs/${JOB_IDS.job}/checks`]: (request) => {
        posts.push(request);
        return jsonResponse({ check: { id: '7d1e2f30-1111-4a4a-9b9b-0000000000c1', ...(request.body as object) }, jobVersion: 4 });
      },
    });
    const { user } = renderApp({ url: `${JOB_URL}?section=checks`, signedInAs: buildSessionUser('lead') });
    await user.click(await screen.findByRole('button', { name: 'Add check' }, { timeout: 10_000 }));
    const form = await screen.findByRole('form', { name: 'New check' }, { timeout: 10_000 });
    await user.click(within(form).getByRole('button', { name: 'Save check' }));
    expect(await within(form).findByText('Choose the channel you measured.')).toBeInTheDocument();
    expect(posts).toHaveLength(0);

    await user.selectOptions(within(form).getByLabelText(/Channel/), `${JOB_IDS.amp}|${JOB_IDS.ch1}`);
    await user.type(within(form).getByLabelText(/Reading/), '7,6');
    // The pass boxes start unticked: a pass is recorded only when the lead ticks it.
    const polarity = within(form).getByRole('checkbox', { name: /Polarity correct/ });
    const insulation = within(form).getByRole('checkbox', { name: /No short to ground/ });
    expect(polarity).not.toBeChecked();
    expect(insulation).not.toBeChecked();
    await user.click(polarity);
    await user.click(insulation);
    await user.click(within(form).getByRole('button', { name: 'Save check' }));
    await waitFor(() => expect(posts).toHaveLength(1));
    expect(posts[0]!.body).toEqual({
      channel: { amplifierItemId: JOB_IDS.amp, channelId: JOB_IDS.ch1 },
      quantity: 'dc_resistance',
      measuredOhm: 7.6,
      isPolarityOk: true,
      isInsulationOk: true,
    });
    await waitFor(() => expect(screen.queryByRole('form', { name: 'New check' })).not.toBeInTheDocument());
  }, 30_000);

  it('should save an amplifier channel’s setup with blank fields as not recorded', async () => {
    const puts: MockRequest[] = [];
    mockApi({
      [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(buildAsBuilt())),
      [`PUT /api/jobs/${JOB_IDS.job}/items/${JOB_IDS.amp}/channels/${JOB_IDS.ch1}/setup`]: (request) => {
        puts.push(request);
        return jsonResponse({ channelSetup: request.body, jobVersion: 4 });
      },
    });
    const { user } = renderApp({ url: `${JOB_URL}?section=amp`, signedInAs: buildSessionUser('lead') });
    const card = await screen.findByLabelText('Garage amp · Patio', undefined, { timeout: 10_000 });
    expect(within(card).getByRole('button', { name: 'Save setup' })).toBeDisabled();
    await user.type(within(card).getByLabelText('Gain'), ' -6 dB ');
    await user.selectOptions(within(card).getByLabelText('Polarity'), 'inverted');
    await user.click(within(card).getByRole('button', { name: 'Save setup' }));
    await waitFor(() => expect(puts).toHaveLength(1));
    expect(puts[0]!.body).toEqual({
      source: null,
      gain: '-6 dB',
      volumeLimit: null,
      eq: null,
      crossover: null,
      polarity: 'inverted',
      firmware: null,
      networkName: null,
      notes: null,
    });
  }, 30_000);

  it('should add a run typed in feet as the shared schema’s shape in metres, naming fields the server refuses', async () => {
    const posts: MockRequest[] = [];
    mockApi({
      [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(buildAsBuilt())),
      [`POST /api/jobs/${JOB_IDS.job}/runs`]: (request) => {
        posts.push(request);
        if (posts.length === 1) {
          return apiErrorResponse(400, {
            message: 'measuredLengthM: longer than the route allows',
            code: 'VALIDATION_FAILED',
            issues: [{ path: 'measuredLengthM', message: 'longer than the route allows' }],
          });
        }
        return jsonResponse({ run: { id: '7d1e2f30-1111-4a4a-9b9b-0000000000d1', ...(request.body as object) }, jobVersion: 4 });
      },
    });
    const { user } = renderApp({ url: JOB_URL, signedInAs: buildSessionUser('lead') });
    await user.click(await screen.findByRole('button', { name: 'Add run' }, { timeout: 10_000 }));
    const form = await screen.findByRole('form', { name: 'New run' }, { timeout: 10_000 });
    await user.click(within(form).getByRole('button', { name: 'Add run' }));
    expect(await within(form).findByText('Choose where the run starts.')).toBeInTheDocument();
    expect(within(form).getByText('Choose where the run ends.')).toBeInTheDocument();
    expect(posts).toHaveLength(0);

    await user.type(within(form).getByLabelText(/^Name/), 'Spa branch');
    await user.selectOptions(within(form).getByLabelText(/^From/), JOB_IDS.amp);
    await user.selectOptions(within(form).getByLabelText(/^To/), JOB_IDS.speaker);
    await user.type(within(form).getByLabelText(/^Cable type/), '14/2 direct burial');
    await user.type(within(form).getByLabelText(/^Gauge/), '14');
    await user.type(within(form).getByLabelText(/^Measured length/), '10');
    await user.selectOptions(within(form).getByLabelText('Pair 1 carries'), `${JOB_IDS.amp}|${JOB_IDS.ch1}`);
    await user.click(within(form).getByRole('button', { name: 'Add run' }));
    expect(await within(form).findByText('Longer than the route allows.')).toBeInTheDocument();

    await user.click(within(form).getByRole('button', { name: 'Add run' }));
    await waitFor(() => expect(posts).toHaveLength(2));
    const body = posts[1]!.body as Record<string, unknown>;
    expect(body).not.toHaveProperty('id');
    expect(body).toMatchObject({
      label: 'Spa branch',
      fromItemId: JOB_IDS.amp,
      toItemId: JOB_IDS.speaker,
      gauge: { system: 'awg', awg: 14 },
      conductors: 2,
      pairs: [{ pairIndex: 1, channel: { amplifierItemId: JOB_IDS.amp, channelId: JOB_IDS.ch1 } }],
      method: 'direct_burial',
      location: 'general',
    });
    // 10 ft on a US browser without server units: 3.048 m exactly (the international foot is defined as 0.3048 m).
    expect(body.measuredLengthM).toBeCloseTo(3.048, 9);
    await waitFor(() => expect(screen.queryByRole('form', { name: 'New run' })).not.toBeInTheDocument());
  }, 30_000);

  it('should add a speaker through the shared item schema, naming the field of a nested problem', async () => {
    const posts: MockRequest[] = [];
    mockApi({
      [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(buildAsBuilt())),
      [`POST /api/jobs/${JOB_IDS.job}/items`]: (request) => {
        posts.push(request);
        return jsonResponse({ item: { id: '7d1e2f30-1111-4a4a-9b9b-0000000000e1', ...(request.body as object) }, jobVersion: 4 });
      },
    });
    const { user } = renderApp({ url: `${JOB_URL}?section=equipment`, signedInAs: buildSessionUser('lead') });
    await user.click(await screen.findByRole('button', { name: 'Add equipment' }, { timeout: 10_000 }));
    await user.type(await screen.findByLabelText(/^Name/, undefined, { timeout: 10_000 }), 'Spa satellite');
    await user.selectOptions(screen.getByLabelText('Wired as'), 'cv');
    await user.click(screen.getByRole('button', { name: 'Add' }));
    // The tap is required on a constant-voltage line: the schema's `constantVoltage.tapWatts` lands under the tap field.
    const tap = screen.getByLabelText('Tap (watts)');
    await waitFor(() => expect(tap).toHaveAttribute('aria-invalid', 'true'));
    expect(posts).toHaveLength(0);

    await user.type(tap, '7,5');
    await user.click(screen.getByRole('button', { name: 'Add' }));
    await waitFor(() => expect(posts).toHaveLength(1));
    // "Installed on" starts at today's date on the phone's calendar.
    const now = new Date();
    const today = `${now.getFullYear()}-${String(now.getMonth() + 1).padStart(2, '0')}-${String(now.getDate()).padStart(2, '0')}`;
    expect(posts[0]!.body).toEqual({ kind: 'speaker', label: 'Spa satellite', installDate: today, constantVoltage: { lineVoltage: '70V', tapWatts: 7.5 } });
  }, 60_000);

  it('should keep an amplifier channel’s id when it is renamed', async () => {
    const puts: MockRequest[] = [];
    mockApi({
      [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(buildAsBuilt())),
      [`PUT /api/jobs/${JOB_IDS.job}/items/${JOB_IDS.amp}`]: (request) => {
        puts.push(request);
        return jsonResponse({ item: request.body, jobVersion: 4 });
      },
    });
    const { user } = renderApp({ url: `${JOB_URL}?section=equipment`, signedInAs: buildSessionUser('lead') });
    const amp = await screen.findByRole('listitem', { name: 'Garage amp' }, { timeout: 10_000 });
    await user.click(within(amp).getByRole('button', { name: 'Change' }));
    const channel = within(amp).getByLabelText('Channel 1 name');
    await user.clear(channel);
    await user.type(channel, 'Patio deck');
    expect(within(amp).getByText(/Not saved yet/)).toBeInTheDocument();
    await user.click(within(amp).getByRole('button', { name: 'Save' }));
    await waitFor(() => expect(puts).toHaveLength(1));
    expect(puts[0]!.body).toMatchObject({ kind: 'amplifier', label: 'Garage amp', channels: [{ id: JOB_IDS.ch1, name: 'Patio deck' }], ratedWatts8Ohm: 60 });
  }, 30_000);
});
