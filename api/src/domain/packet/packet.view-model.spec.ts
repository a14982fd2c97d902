import { describe, expect, it } from 'vitest';

import { DEMO_AS_BUILT } from '../as-built/demo-as-built.js';
import { cableScheduleCsv, csvCell } from './cable-schedule-csv.js';
import { demoPacketSnapshot } from './demo-packet-snapshot.js';
import { safeFileName, sha256Manifest } from './manifest.js';
import { formatDate, formatDepth, formatGaugeForUnits, formatLength, formatOhm } from './packet-format.js';
import { buildPacketViewModel, PACKET_SECTIONS } from './packet.view-model.js';

const locateUrl = 'https://app.example/locate/rev-1';

describe('packet formatting', () => {
  it.each([
    [8.01, 'imperial', '26 ft 3 in'],
    [0.3048, 'imperial', '1 ft'],
    [8.01, 'metric', '8.01 m'],
    [1234.5, 'metric', '1234.5 m'],
  ] as const)('should format a length of %s m (%s) as %s', (m, units, expected) => {
    expect(formatLength(m, units)).toBe(expected);
  });

  it.each([
    // 0.11 m = 4.331 in → nearest 1/4 in is 4 1/4 (1 in = 0.0254 m exactly, NIST SP 811 B.8)
    [0.11, 'imperial', '4 1/4 in'],
    [0.1524, 'imperial', '6 in'],
    [0.005, 'imperial', '1/4 in'],
    [0.11, 'metric', '11 cm'],
    [0.455, 'metric', '46 cm'],
  ] as const)('should format a depth of %s m (%s) as %s', (m, units, expected) => {
    expect(formatDepth(m, units)).toBe(expected);
  });

  it.each([
    [{ system: 'awg', awg: 12 }, 'imperial', '12 AWG'],
    [{ system: 'awg', awg: 12 }, 'metric', '3.31 mm² (12 AWG)'],
    [{ system: 'awg', awg: -1 }, 'imperial', '2/0 AWG'],
    [{ system: 'mm2', mm2: 2.5 }, 'metric', '2.5 mm²'],
    [{ system: 'mm2', mm2: 2.5 }, 'imperial', '2.5 mm² (≈ 13 AWG)'],
  ] as const)('should format gauge %j (%s) as %s', (gauge, units, expected) => {
    expect(formatGaugeForUnits(gauge, units)).toBe(expected);
  });

  it('should format ohms with the Greek capital omega, and open circuits in words', () => {
    expect(formatOhm(5.3333)).toBe('5.33 Ω');
    expect(formatOhm(null)).toBe('open');
    expect(formatOhm(Number.POSITIVE_INFINITY)).toBe('open');
  });

  it('should write dates unambiguously, timestamps in UTC', () => {
    expect(formatDate('2026-05-14')).toBe('14 May 2026');
    expect(formatDate('2026-12-31T23:30:00.000Z')).toBe('31 Dec 2026');
    expect(formatDate(null)).toBe('—');
  });
});

describe(buildPacketViewModel.name, () => {
  const sut = () => buildPacketViewModel({ snapshot: demoPacketSnapshot(), locateUrl });

  it('should list the sections of PRODUCT.md in order, leaving out those with nothing recorded, pages unknown until the first pass', () => {
    const vm = sut();
    // No photos are passed and nothing was acknowledged at issue. Nor does it follow an earlier packet of the site, so nothing to say under What changed.
    const absent = new Set(['known-exceptions', 'what-changed', 'photos']);
    expect(vm.toc.map((t) => t.title)).toEqual(PACKET_SECTIONS.filter((s) => !absent.has(s.id)).map((s) => s.title));
    expect(vm.toc.map((t) => t.number)).toEqual(vm.toc.map((_, i) => String(i + 1)));
    expect(vm.num['photos']).toBeUndefined();
    const noWalls = buildPacketViewModel({
      snapshot: demoPacketSnapshot({ asBuilt: { ...DEMO_AS_BUILT, items: DEMO_AS_BUILT.items.filter((i) => i.kind !== 'wall_entry'), runs: [] } }),
      locateUrl,
    });
    expect(noWalls.toc.map((t) => t.id)).not.toContain('wall-entries');
    expect(noWalls.toc.map((t) => t.id)).not.toContain('depth-profiles');
    expect(vm.toc.every((t) => t.page === '–')).toBe(true);
    const numbered = buildPacketViewModel({ snapshot: demoPacketSnapshot(), locateUrl, pageNumbers: { summary: 3, engineering: 19 } });
    expect(numbered.toc[0]).toMatchObject({ number: '1', title: 'System summary', page: '3' });
    // The Engineering notes appendix comes last, after the sign-off.
    expect(numbered.toc.at(-2)).toMatchObject({ title: 'Sign-off' });
    expect(numbered.toc.at(-1)).toMatchObject({ title: 'Engineering notes', page: '19' });
  });

  it('should list acknowledged findings as known exceptions in homeowner words, never as instructions', () => {
    const plain = sut();
    expect(plain.knownExceptions).toEqual([]);
    expect(plain.summary.exceptionsNote).toBe('');
    const snapshot = demoPacketSnapshot();
    const shallow = snapshot.analysis.findings.find((f) => f.code === 'DEPTH_SHALLOW')!;
    snapshot.acknowledgements = [
      { code: 'DEPTH_SHALLOW', path: shallow.path.join('.'), severity: 'warning', reason: 'Rock shelf under the patio edge; sleeved instead.', message: shallow.message },
    ];
    const vm = buildPacketViewModel({ snapshot, locateUrl });
    expect(vm.toc.map((t) => t.id)).toContain('known-exceptions');
    expect(vm.num['known-exceptions']).toBe('2');
    expect(vm.knownExceptions).toHaveLength(1);
    const text = vm.knownExceptions[0]!.text;
    // 11 cm ≈ 4.3 in of cover, the default general rule 15 cm ≈ 5.9 in, written in the company's units.
    expect(text).toContain('runs shallower than our standard');
    expect(text).toContain('Patio splice to P2');
    expect(text).toMatch(/4 1\/4 in of cover where our standard is 6 in/);
    expect(text).toContain('marked on the site plan');
    expect(text).not.toMatch(/Bury it deeper|cm\b/);
    expect(vm.knownExceptions[0]!.reason).toBe('Rock shelf under the patio edge; sleeved instead.');
    expect(vm.summary.exceptionsNote).toBe('One known exception is described on the next page.');
    expect(vm.engineering.findings.find((f) => f.message === shallow.message)?.acknowledged).toContain('Rock shelf');
  });

  it('should keep the engineering figures out of the summary and in the appendix', () => {
    const vm = sut();
    expect(Object.keys(vm.summary.channels[0]!)).not.toContain('output');
    expect(vm.summary.channels[0]).toMatchObject({ status: 'Working as designed' });
    expect(vm.engineering.channels[0]).toMatchObject({ output: expect.stringMatching(/W$/) });
    expect(vm.engineering.assumptions.length).toBeGreaterThan(0);
  });

  it('should print only the amplifier settings that were recorded', () => {
    const snapshot = demoPacketSnapshot();
    for (const id of Object.keys(snapshot.channelSetups)) snapshot.channelSetups[id] = {} as (typeof snapshot.channelSetups)[string];
    const vm = buildPacketViewModel({ snapshot, locateUrl });
    for (const channel of vm.amplifiers[0]!.channels) {
      expect(channel.settings.map((s) => s.label)).toEqual(['Load']);
      expect(channel.isEmpty).toBe(true);
    }
    expect(sut().amplifiers[0]!.channels[0]!.settings.every((s) => s.value !== '—')).toBe(true);
  });

  it('should fill the cover from the snapshot', () => {
    expect(sut().cover).toMatchObject({
      companyName: 'Quillmoss Outdoor Audio',
      jobTitle: 'Rear-yard audio',
      addressLines: ['14 Larkspur Way', 'Nowhereton, CO 00000', 'United States'],
      revisionLabel: 'Revision 1',
      issuedDate: '20 May 2026',
      crewLead: 'Riley Crewlead',
      workDates: '12 May 2026 – 14 May 2026',
      locateUrl,
    });
  });

  it('should give one cable row per run, imperial, with the shallow reading flagged', () => {
    const { rows } = sut().cables;
    expect(rows).toHaveLength(DEMO_AS_BUILT.runs.length);
    const p2 = rows.find((r) => r.label === 'Patio splice to P2')!;
    expect(p2).toMatchObject({ gauge: '14 AWG, 2-cond.', method: 'Direct burial', minDepth: '4 1/4 in', depthStatus: 'Shallow reading', depthClass: 'bad' });
    expect(rows.find((r) => r.label.startsWith('Spare'))).toMatchObject({ spare: 'Spare run' });
  });

  it('should print the same record in metric for a metric company', () => {
    const vm = buildPacketViewModel({ snapshot: demoPacketSnapshot({ settings: { units: 'metric', paperSize: 'a4' } }), locateUrl });
    expect(vm.paper).toEqual({ size: 'a4', cssSize: 'A4', name: 'A4' });
    expect(vm.cables.rows.find((r) => r.label === 'Patio splice to P2')).toMatchObject({ minDepth: '11 cm', gauge: '2.08 mm² (14 AWG), 2-cond.' });
    expect(vm.locate.toleranceZone).toBe('0.5 m');
    expect(vm.cautions[2]!.body).toContain('Within 0.5 m on either side');
  });

  it('should carry every caution PRODUCT.md asks for, with the tolerance zone filled in', () => {
    const text = sut().cautions.map((c) => `${c.title}. ${c.body}`).join('\n');
    expect(text).toContain('one-call centre');
    expect(text).toContain('do not mark private lines');
    expect(text).toContain('Within 18 in on either side of a mapped route');
    expect(text).toContain('Depths are as installed');
    expect(text).toContain('licensed electrician');
    expect(text).toContain('Line-voltage work is not part of this installation');
    expect(text).toContain('authority having jurisdiction');
    expect(text).toContain('not a code inspection or approval');
    expect(text).not.toContain('{zone}');
  });

  it('should summarise the channels and the commissioning comparison', () => {
    const vm = sut();
    expect(vm.engineering.channels.map((c) => c.load)).toEqual(['4 Ω', '5.33 Ω']);
    expect(vm.commissioning.rows.length).toBe(DEMO_AS_BUILT.checks.length);
    expect(vm.commissioning.rows[0]).toMatchObject({ quantity: expect.any(String), measured: expect.stringMatching(/Ω$/) });
  });

  it('should leave out signatures not collected, with one line saying so, and print the signer with one', () => {
    expect(sut().signOff).toMatchObject({ signatures: [], unsignedNote: 'The walkthrough was not signed.' });
    const signed = buildPacketViewModel({
      snapshot: demoPacketSnapshot(),
      locateUrl,
      signatures: [{ role: 'homeowner', signerName: 'Dara Penhallow', signedAt: '2026-05-20T17:00:00Z', svgPath: 'M 1 1 L 10 10' }],
    });
    expect(signed.signOff.signatures).toEqual([
      { role: 'Homeowner', name: 'Dara Penhallow', isSigned: true, signedAt: '20 May 2026, 17:00 UTC', svgPath: 'M 1 1 L 10 10' },
    ]);
    expect(signed.signOff.unsignedNote).toBe('The walkthrough was signed by the homeowner only.');
  });

  it('should pass photos through with their captions and a readable time', () => {
    const vm = buildPacketViewModel({
      snapshot: demoPacketSnapshot(),
      locateUrl,
      photos: [{ caption: 'Open trench, patio run', takenAt: '2026-05-13T15:04:00Z', dataUri: 'data:image/jpeg;base64,AAAA' }],
    });
    expect(vm.hasPhotos).toBe(true);
    expect(vm.photos[0]).toEqual({ caption: 'Open trench, patio run', takenAt: '13 May 2026, 15:04 UTC', dataUri: 'data:image/jpeg;base64,AAAA' });
  });

  it('should be deterministic', () => {
    expect(sut()).toEqual(sut());
  });
});

describe('archive helpers', () => {
  it('should quote CSV cells and defuse spreadsheet formulas', () => {
    expect(csvCell('plain')).toBe('plain');
    expect(csvCell('a, "b"')).toBe('"a, ""b"""');
    expect(csvCell('=HYPERLINK("x")')).toBe(`"'=HYPERLINK(""x"")"`);
    expect(csvCell(-3)).toBe('-3');
  });

  it('should write one CSV row per run with CRLF line ends', () => {
    const lines = cableScheduleCsv(demoPacketSnapshot()).split('\r\n');
    expect(lines[0]).toMatch(/^run,from,to,cable_type,gauge/);
    expect(lines).toHaveLength(DEMO_AS_BUILT.runs.length + 2);
    expect(lines.at(-1)).toBe('');
  });

  it('should write a sha256sum manifest sorted by path', () => {
    expect(sha256Manifest([{ path: 'b.txt', sha256: 'bb' }, { path: 'a.txt', sha256: 'aa' }])).toBe('aa  a.txt\nbb  b.txt\n');
    expect(safeFileName('Open trench: patio → spa!', 'photo')).toBe('open-trench-patio-spa');
    expect(safeFileName('***', 'photo')).toBe('photo');
  });
});
