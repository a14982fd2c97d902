import { fireEvent, render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { markingMeaning, REFERENCE_INK, RUN_ORANGE } from '@drawings/marking-palette';
import { describe, expect, it } from 'vitest';

import { buildSiteMap } from '../testing-fixtures';

import { boxesOverlap, labelBox } from '../utils/map-labels';

import { runMapLabel, runProvenanceText, SiteMapPlan } from './site-map-plan';

/*
 * Stroke colours by role on the locate / portal map. Source of the colour meanings: APWA Uniform Color
 * Code, as published in the CGA Best Practices (Appendix B): orange is communication and signal cable;
 * red power, yellow gas, green sewer, blue potable water, purple reclaimed water are other utilities'.
 */
const OTHER_UTILITIES = ['power', 'gas', 'sewer', 'water', 'reclaimed'];

function mapWithEveryRunKind() {
  const map = buildSiteMap();
  const base = map.runs[0]!;
  const kinds = [
    { method: 'conduit' as const },
    { method: 'under_hardscape_sleeve' as const },
    { method: 'indoor' as const },
    { method: 'direct_burial' as const, isSpare: true },
    { method: 'direct_burial' as const, isAbandoned: true },
    { method: 'direct_burial' as const, isRouteDrawn: false },
  ];
  map.runs = [base, ...kinds.map((k, i) => ({ ...base, id: `run-${i + 2}`, label: `Run ${i + 2}`, route: base.route!.map((p) => ({ x: p.x, y: p.y + i + 1 })), ...k }))];
  return map;
}

describe('SiteMapPlan marking colours', () => {
  it('should draw every run orange, reference points black, and no other utility colour anywhere', async () => {
    const { container } = render(
      <SiteMapPlan map={mapWithEveryRunKind()} units="imperial" locale="en-US" />
    );
    await screen.findByText('East fence');
    const runStrokes = Array.from(container.querySelectorAll('[data-run-id] [data-role="run-stroke"]'));
    expect(runStrokes.length).toBe(7);
    for (const el of runStrokes) expect(el.getAttribute('stroke')).toBe(RUN_ORANGE);
    // Kinds are told apart by weight and dash, never by colour.
    const looks = new Set(runStrokes.map((el) => `${el.getAttribute('stroke-width')}|${el.getAttribute('stroke-dasharray') ?? ''}`));
    expect(looks.size).toBe(7);
    const refs = Array.from(container.querySelectorAll('[aria-label^="Reference point"] [stroke]'));
    expect(refs.length).toBeGreaterThan(0);
    for (const el of refs) expect(el.getAttribute('stroke')).toBe(REFERENCE_INK);
    for (const el of Array.from(container.querySelectorAll('svg [stroke], svg [fill]'))) {
      for (const attr of ['stroke', 'fill']) {
        const value = el.getAttribute(attr);
        if (value === null || value.startsWith('var(')) continue;
        expect(OTHER_UTILITIES, `${el.tagName} ${attr}=${value}`).not.toContain(markingMeaning(value));
      }
    }
    // Landmarks in muted grey, drawn first (under the runs), named.
    const features = container.querySelector('[data-layer="features"]')!;
    expect(features.querySelectorAll('[data-feature-id]').length).toBe(2);
    expect(features.compareDocumentPosition(container.querySelector('[data-run-id]')!) & Node.DOCUMENT_POSITION_FOLLOWING).toBeTruthy();
    for (const el of Array.from(features.querySelectorAll('polygon, polyline'))) expect(markingMeaning(el.getAttribute('stroke')!)).toBe('neutral');
    expect(screen.getByText('East fence')).toBeInTheDocument();
    // The legend names the colour and the white of a dig area, in the words of the printed legend.
    expect(screen.getByText(/Orange: buried speaker and signal cable/)).toBeInTheDocument();
    expect(screen.getByText('Cable in conduit (heavy)')).toBeInTheDocument();
    expect(screen.getByText('Abandoned run, still buried (crosses)')).toBeInTheDocument();
  });
});

function renderMap(map = buildSiteMap(), props: Partial<Parameters<typeof SiteMapPlan>[0]> = {}) {
  return render(
    <SiteMapPlan map={map} units="imperial" locale="en-US" {...props} />
  );
}

function labelBoxes(container: HTMLElement) {
  return Array.from(container.querySelectorAll<SVGTextElement>('[data-label]')).map((el) => {
    const text = el.textContent ?? '';
    const size = Number(el.getAttribute('font-size'));
    const weight = el.getAttribute('font-weight') === 'bold' ? 'bold' : 'normal';
    const anchor = el.getAttribute('text-anchor') as 'start' | 'middle' | 'end';
    return { id: el.getAttribute('data-label')!, size, box: labelBox(text, size, weight, { x: Number(el.getAttribute('x')), y: Number(el.getAttribute('y')), textAnchor: anchor }) };
  });
}

function expectNoOverlapOrClip(container: HTMLElement) {
  const labels = labelBoxes(container);
  // The frame's size in jsdom (no layout): the map's fallback 360 × 420.
  for (const l of labels) {
    expect(l.size).toBeGreaterThanOrEqual(12);
    expect(l.box.left, l.id).toBeGreaterThanOrEqual(0);
    expect(l.box.top, l.id).toBeGreaterThanOrEqual(0);
    expect(l.box.right, l.id).toBeLessThanOrEqual(360);
    expect(l.box.bottom, l.id).toBeLessThanOrEqual(420);
  }
  for (let i = 0; i < labels.length; i += 1) {
    for (let j = i + 1; j < labels.length; j += 1) expect(boxesOverlap(labels[i]!.box, labels[j]!.box), `${labels[i]!.id} / ${labels[j]!.id}`).toBe(false);
  }
  return labels;
}

/** Forty speakers a metre apart along one fence, each with a run: far more labels than fit at first. */
function crowdedMap() {
  const map = buildSiteMap();
  const base = map.runs[0]!;
  const item = map.items[1]!;
  map.items = Array.from({ length: 40 }, (_, i) => ({ ...item, id: `spk-${i}`, label: `Speaker ${i + 1} by the east fence`, position: { x: i, y: (i % 3) * 0.4, source: 'ties' as const, accuracyM: 0.05 } }));
  map.runs = Array.from({ length: 40 }, (_, i) => ({ ...base, id: `run-${i}`, label: `Run ${i}`, route: [{ x: i, y: 0 }, { x: i, y: -3 }] }));
  return map;
}

describe('SiteMapPlan pan, zoom and labels', () => {
  it('should fit the site, change the scale bar with the zoom, and keep labels at 12 px or more, apart and inside', async () => {
    const { container } = renderMap();
    const svg = container.querySelector('svg[data-testid="locate-map"]')!;
    await waitFor(() => expect(Number(svg.getAttribute('data-zoom'))).toBeGreaterThan(1));
    const before = screen.getByTestId('scale-bar-label').textContent;
    expect(before).toMatch(/ft$/);
    expect(screen.getByText('Run A: min 12 in')).toBeInTheDocument();
    expectNoOverlapOrClip(container);
    // North arrow: plan north at 15° east of the plan's up is drawn turned 15° anticlockwise.
    expect(screen.getByTestId('north-arrow').getAttribute('transform')).toBe('rotate(-15)');

    const zoomBefore = Number(svg.getAttribute('data-zoom'));
    await userEvent.click(screen.getByRole('button', { name: 'Zoom in' }));
    await userEvent.click(screen.getByRole('button', { name: 'Zoom in' }));
    await waitFor(() => expect(Number(svg.getAttribute('data-zoom'))).toBeCloseTo(zoomBefore * 1.6 * 1.6, 3));
    expect(screen.getByTestId('scale-bar-label').textContent).not.toBe(before);
    expectNoOverlapOrClip(container);

    await userEvent.click(screen.getByRole('button', { name: 'Show the whole site' }));
    await waitFor(() => expect(Number(svg.getAttribute('data-zoom'))).toBeCloseTo(zoomBefore, 3));
    expect(screen.getByTestId('scale-bar-label').textContent).toBe(before);
  });

  it('should hide the labels that do not fit on a crowded site and never let two overlap', async () => {
    const { container } = renderMap(crowdedMap());
    const svg = container.querySelector('svg[data-testid="locate-map"]')!;
    await waitFor(() => expect(Number(svg.getAttribute('data-zoom'))).toBeGreaterThan(1));
    const labels = expectNoOverlapOrClip(container);
    // 80+ labels asked for; fewer shown, the runs' depths first.
    expect(labels.length).toBeLessThan(80);
    expect(labels.length).toBeGreaterThan(0);
    expect(labels[0]!.id).toMatch(/^run:/);
    await userEvent.click(screen.getByRole('button', { name: 'Zoom in' }));
    await userEvent.click(screen.getByRole('button', { name: 'Zoom in' }));
    expectNoOverlapOrClip(container);
  });

  it('should say so when nothing has a position', () => {
    const map = buildSiteMap();
    map.items = map.items.map((i) => ({ ...i, position: null }));
    map.runs = map.runs.map((r) => ({ ...r, route: null }));
    map.referencePoints = [];
    map.siteFeatures = [];
    renderMap(map);
    expect(screen.getByText('Nothing on this site has a position on the plan yet.')).toBeInTheDocument();
  });
});

describe('SiteMapPlan tapping a run, shallow runs and ties', () => {
  it('should report a tapped run, highlight it and mark its shallowest reading; flag shallow runs', async () => {
    const map = buildSiteMap();
    const selected: string[] = [];
    const { container, rerender } = renderMap(map, { onSelectRun: (id) => selected.push(id), shallowRunIds: new Set(['run-1']) });
    await screen.findByText('⚠ Run A: min 12 in');
    expect(container.querySelector('[data-run-id="run-1"]')!.getAttribute('data-shallow')).toBe('true');
    expect(container.querySelector('[data-role="shallowest"]')).toBeNull();
    // A plain click (jsdom's pointer events carry no view, which d3-zoom's pointer-down reads); the e2e test taps.
    fireEvent.click(container.querySelector('[data-run-id="run-1"] [data-role="run-hit"]')!);
    expect(selected).toEqual(['run-1']);

    rerender(
      <SiteMapPlan map={map} units="imperial" locale="en-US" selectedRunId="run-1" shallowRunIds={new Set(['run-1'])} />,
    );
    expect(container.querySelector('[data-run-id="run-1"]')!.getAttribute('data-selected')).toBe('true');
    expect(container.querySelector('[data-run-id="run-1"] [data-role="highlight"]')).not.toBeNull();
    // The shallowest reading (12 in at 5.5 m of 11 m) sits halfway along the drawn route (1,1)→(9,6): plan (5, 3.5).
    const mark = container.querySelector('[data-role="shallowest"]')!;
    expect(mark.getAttribute('aria-label')).toBe('Shallowest point of Run A: 12 in');
    const svg = container.querySelector('svg[data-testid="locate-map"]')!;
    const [k] = [Number(svg.getAttribute('data-zoom'))];
    const circle = mark.querySelector('circle')!;
    const ref = container.querySelector('[aria-label="Reference point House corner NE"] circle')!;
    // Plan (5, 3.5) is 5 m right and 3.5 m up of the reference point at (0, 0).
    expect(Number(circle.getAttribute('cx')) - Number(ref.getAttribute('cx'))).toBeCloseTo(5 * k, 3);
    expect(Number(circle.getAttribute('cy')) - Number(ref.getAttribute('cy'))).toBeCloseTo(-3.5 * k, 3);
    expect(screen.getByText('shallowest 12 in')).toBeInTheDocument();
  });

  it('should draw the taped ties only when asked, with their distances in the viewer’s units', async () => {
    const map = buildSiteMap();
    map.referencePoints.push({ id: 'rp-2', label: 'Gate post', x: 12, y: 0 });
    // 3-4-5: speaker at (9, 6) is hypot(9, 6) from rp-1 and hypot(3, 6) from rp-2.
    map.items[1]!.ties = [
      { referencePointId: 'rp-1', distanceM: Math.hypot(9, 6) },
      { referencePointId: 'rp-2', distanceM: Math.hypot(3, 6) },
    ];
    const { container, rerender } = renderMap(map, { units: 'metric' } as never);
    await screen.findByText('East fence');
    expect(container.querySelectorAll('[data-tie]').length).toBe(0);
    rerender(
      <SiteMapPlan map={map} units="metric" locale="en-US" showTies />,
    );
    const ties = Array.from(container.querySelectorAll('[data-tie]'));
    expect(ties.length).toBe(2);
    expect(ties.map((t) => t.getAttribute('aria-label'))).toEqual(['House corner NE to Speaker L: 10.82 m', 'Gate post to Speaker L: 6.71 m']);
    expectNoOverlapOrClip(container);
  });
});

describe('run labels and provenance on the map (issue 21)', () => {
  const run = { ...buildSiteMap().runs[0]!, label: 'Spare to planter', minDepthM: 0.3048, installedOn: '2026-05-14', installedByJobTitle: 'Garden speakers' };

  it('names the run beside its depth, and says since when an abandoned run is abandoned', () => {
    expect(runMapLabel({ ...run, isAbandoned: false, abandonedOn: null }, 'imperial')).toBe('Spare to planter: min 12 in');
    expect(runMapLabel({ ...run, isAbandoned: true, abandonedOn: '2027-06-02' }, 'imperial')).toBe('Spare to planter: min 12 in (abandoned since Jun 2, 2027)');
    expect(runMapLabel({ ...run, isAbandoned: true, abandonedOn: null }, 'imperial')).toBe('Spare to planter: min 12 in (abandoned)');
  });

  it('says in the tooltip when the run went in and by which job, dates written out', () => {
    expect(runProvenanceText({ ...run, abandonedOn: '2027-06-02' })).toBe('Spare to planter (installed May 14, 2026 by “Garden speakers”, abandoned since Jun 2, 2027)');
    expect(runProvenanceText({ ...run, installedOn: null, abandonedOn: null })).toBe('Spare to planter (installed by “Garden speakers”, date not recorded)');
  });
});
