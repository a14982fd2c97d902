import { describe, expect, it } from 'vitest';

import type { LocateViewResponse } from './locate-link.schema.js';
import { locateCautions } from './locate-cautions.js';
import { buildLocateSheetViewModel } from './locate-sheet.view-model.js';

const run = (id: string, isShallow: boolean, minDepthM: number | null): LocateViewResponse['runs'][number] => ({
  id,
  label: `Run ${id}`,
  cable: 'CL2',
  gauge: '14 AWG',
  method: 'direct_burial',
  minDepthM,
  maxDepthM: minDepthM,
  minCoverM: 0.1524,
  isShallow,
  isSpare: false,
  isAbandoned: false,
  revision: 1,
  depthProfileUrl: '',
  photos: [],
});

function view(units: 'imperial' | 'metric', runs: LocateViewResponse['runs']): LocateViewResponse {
  return {
    site: { label: 'Wrenfold Close', addressLine1: '12 Wrenfold Close', addressLine2: null, city: 'Quellbrook', region: 'XX', postalCode: '00000', country: 'US', northAzimuthDeg: 0 },
    installer: { companyName: 'Garden Sound Co', phone: '+1 (555) 010-0100', email: null, licenceNumbers: [] },
    locateSteps: [],
    cautions: [],
    cautionSummary: '',
    toleranceZoneM: 0.457,
    locale: 'en-US',
    timeZone: null,
    units,
    map: { frame: { northAzimuthDeg: 0, origin: null }, revisions: [], referencePoints: [], siteFeatures: [], items: [], runs: [], geojson: null },
    runs,
    geojsonUrl: null,
    sheetUrl: '',
    link: { expiresAt: '2026-12-31T00:00:00.000Z', note: null },
    generatedAt: '2026-06-01T08:00:00.000Z',
  };
}

describe('buildLocateSheetViewModel', () => {
  it('should list shallow runs first with depths in fractions of an inch, and a dialable phone', () => {
    const vm = buildLocateSheetViewModel(view('imperial', [run('a', false, 0.4572), run('b', true, 0.1048)]), 'letter');
    expect(vm.runs.map((r) => r.label)).toEqual(['Run b', 'Run a']);
    // 0.1048 m = 4.126 in → 4 1/8 in to the nearest eighth; 0.4572 m = 18 in exactly (1 in = 25.4 mm, NIST SP 811).
    expect(vm.runs.map((r) => r.minDepth)).toEqual(['4 1/8 in', '18 in']);
    expect(vm.runs[0]!.note).toBe('SHALLOWER than the depth rule (6 in): hand-dig');
    expect(vm.installer.phoneHref).toBe('tel:+15550100100');
    expect(vm.paper.cssSize).toBe('Letter');
    expect(vm.footer).toContain('authority having jurisdiction');
    expect(vm.toleranceZone).toBe('18 in');
    expect(vm.noRunsText).toBeNull();
  });

  it('should say when each run went in and by which job, and since when an abandoned run is abandoned (issue 21)', () => {
    const old = { ...run('a', false, 0.4572), isAbandoned: true, installedOn: '2026-05-14', installedByJobTitle: 'Garden speakers', abandonedOn: '2027-06-02' };
    const newer = { ...run('b', false, 0.4572), installedOn: '2027-06-02', installedByJobTitle: 'Lawn rework', abandonedOn: null };
    const vm = buildLocateSheetViewModel(view('imperial', [old, newer]), 'letter');
    expect(vm.runs.map((r) => r.note)).toEqual([
      'abandoned since Jun 2, 2027; installed May 14, 2026 by “Garden speakers”',
      'installed Jun 2, 2027 by “Lawn rework”',
    ]);
  });

  it('should write metric depths in centimetres, A4, and say when there are no runs', () => {
    const vm = buildLocateSheetViewModel(view('metric', []), 'a4');
    expect(vm.noRunsText).toBe('No runs have been recorded at this site.');
    expect(vm.paper.cssSize).toBe('A4');
    expect(vm.toleranceZone).toBe('0.5 m');
    expect(buildLocateSheetViewModel(view('metric', [run('c', false, 0.3)]), 'a4').runs[0]!.minDepth).toBe('30 cm');
  });
});

describe('locateCautions', () => {
  it('should write the tolerance zone as the packet does and spell the words for the company locale (en-US default)', () => {
    const us = locateCautions('imperial', 'en-US');
    // 18 in either side of the facility (CGA Best Practice 5-19); metric rounded up to 0.5 m, never narrower than 0.4572 m.
    expect(us.toleranceZone).toBe('18 in');
    expect(locateCautions('metric').toleranceZone).toBe('0.5 m');
    expect(us.summary).toBe(
      'Before any digging, contact the one-call center (811 in the United States); one-call locators do not mark these private cables, so use this map and hand-dig within 18 in of a mapped route.',
    );
    const all = (c: ReturnType<typeof locateCautions>) => [c.summary, ...[...c.locateSteps, ...c.cautions].flatMap((t) => [t.title, t.body])].join('\n');
    expect(all(us)).not.toMatch(/centre|colour|\{\w+\}/);
    expect(all(locateCautions('metric', null))).not.toMatch(/centre|colour/);
    const gb = locateCautions('metric', 'en-GB');
    expect(gb.summary).toContain('one-call centre');
    expect(all(gb)).toContain('marking colour');
    expect(all(gb)).not.toMatch(/center|\bcolor\b/);
  });

  it('should spell the locate sheet words for the locale', () => {
    expect(buildLocateSheetViewModel({ ...view('imperial', []), locale: 'en-US' }, 'letter').words).toEqual({ center: 'center', color: 'color' });
    expect(buildLocateSheetViewModel({ ...view('metric', []), locale: 'en-AU' }, 'a4').words).toEqual({ center: 'centre', color: 'colour' });
  });
});
