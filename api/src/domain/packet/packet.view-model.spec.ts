import { describe, expect, it } from 'vitest';

import { DEMO_AS_BUILT } from '../as-built/demo-as-built.js';
import { cableScheduleCsv, csvCell } from './cable-schedule-csv.js';
import { demoPacketSnapshot } from './demo-packet-snapshot.js';
import { safeFileName, sha256Manifest } from './manifest.js';
import { buildPacketViewModel, PACKET_SECTIONS } from './packet.view-model.js';

const locateUrl = 'https://app.example/locate/rev-1';

describe('packet dates (the company\'s time zone and locale, domain/format/date-time)', () => {
  // 2026-05-21T02:30Z is the evening of May 20 in Denver (UTC−6, MDT) and the morning of May 21 in
  // London (UTC+1, BST): IANA tz database offsets; CLDR patterns "MMM d, y" (en-US), "d MMM y" (en-GB), from memory.
  it.each([
    ['America/Denver', 'en-US', 'May 20, 2026'],
    ['Europe/London', 'en-GB', '21 May 2026'],
    [null, 'en-US', 'May 21, 2026'],
  ] as const)('should print the issue date of an evening issue in %s (%s) as %s, on the cover and in the footer', (timeZone, locale, date) => {
    const snapshot = demoPacketSnapshot();
    snapshot.issuedAt = '2026-05-21T02:30:00.000Z';
    snapshot.settings = { ...snapshot.settings, timeZone, locale };
    const vm = buildPacketViewModel({ snapshot, locateUrl });
    expect(vm.cover.issuedDate).toBe(date);
    expect(vm.footerText).toContain(`Revision 1, ${date}`);
    // A calendar date (the work dates) is the same day in every zone.
    expect(vm.cover.workDates).toBe(locale === 'en-GB' ? '12 May 2026 – 14 May 2026' : 'May 12, 2026 – May 14, 2026');
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
    expect(text).toMatch(/4 3\/8 in of cover where our standard is 6 in/);
    expect(text).toContain('marked on the site plan');
    expect(text).not.toMatch(/Bury it deeper|cm\b/);
    expect(vm.knownExceptions[0]!.reason).toBe('Rock shelf under the patio edge; sleeved instead.');
    expect(vm.summary.exceptionsNote).toBe('One known exception is described on the next page.');
    expect(vm.engineering.findings.find((f) => f.message.startsWith('Run "Patio splice to P2" has 4 3/8 in of cover'))?.acknowledged).toContain('Rock shelf');
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
      issuedDate: 'May 20, 2026',
      crewLead: 'Riley Crewlead',
      workDates: 'May 12, 2026 – May 14, 2026',
      locateUrl,
    });
  });

  it('should give one cable row per run, imperial, with the shallow reading flagged', () => {
    const { rows } = sut().cables;
    expect(rows).toHaveLength(DEMO_AS_BUILT.runs.length);
    const p2 = rows.find((r) => r.label === 'Patio splice to P2')!;
    expect(p2).toMatchObject({ gauge: '14 AWG, 2-cond.', method: 'Direct burial', minDepth: '4 3/8 in', depthStatus: 'Shallow reading', depthClass: 'bad' });
    expect(rows.find((r) => r.label.startsWith('Spare'))).toMatchObject({ spare: 'Spare run' });
  });

  it('should print the same record in metric for a metric company', () => {
    const vm = buildPacketViewModel({ snapshot: demoPacketSnapshot({ settings: { units: 'metric', paperSize: 'a4' } }), locateUrl });
    expect(vm.paper).toEqual({ size: 'a4', cssSize: 'A4', name: 'A4' });
    expect(vm.cables.rows.find((r) => r.label === 'Patio splice to P2')).toMatchObject({ minDepth: '11 cm', gauge: '2.08 mm² (14 AWG), 2-cond.' });
    expect(vm.locate.toleranceZone).toBe('0.5 m');
    expect(vm.cautions[2]!.body).toContain('Within 0.5 m on either side');
  });

  it('should spell the cautions and locate page for the company locale: en-US by default, Commonwealth spelling for en-GB', () => {
    const words = (vm: ReturnType<typeof sut>) =>
      [vm.locate.heading, ...vm.locate.steps.flatMap((c) => [c.title, c.body]), ...vm.cautions.flatMap((c) => [c.title, c.body])].join('\n');
    const us = words(sut());
    expect(sut().locate.heading).toBe('Before you dig: contact the one-call center');
    expect(us).toContain('marking color');
    expect(us).not.toMatch(/centre|colour|\{\w+\}/);
    const gb = buildPacketViewModel({ snapshot: demoPacketSnapshot({ settings: { locale: 'en-GB' } }), locateUrl });
    expect(gb.locate.heading).toBe('Before you dig: contact the one-call centre');
    expect(words(gb)).toContain('marking colour');
    expect(words(gb)).not.toMatch(/center|\bcolor\b|\{\w+\}/);
  });

  it('should carry every caution PRODUCT.md asks for, with the tolerance zone filled in', () => {
    const text = sut().cautions.map((c) => `${c.title}. ${c.body}`).join('\n');
    expect(text).toContain('one-call center');
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
      { role: 'Homeowner', name: 'Dara Penhallow', isSigned: true, signedAt: 'May 20, 2026, 5:00 PM UTC', svgPath: 'M 1 1 L 10 10' },
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
    expect(vm.photos[0]).toEqual({ caption: 'Open trench, patio run', takenAt: 'May 13, 2026, 3:04 PM UTC', dataUri: 'data:image/jpeg;base64,AAAA' });
  });

  it('should say which findings are also about records an earlier job left in the ground (issue 21)', () => {
    const snapshot = demoPacketSnapshot();
    const open = snapshot.analysis.findings.filter((f) => f.severity !== 'info');
    const onRun = open.find((f) => f.runId !== undefined && f.channel === undefined)!;
    const run = snapshot.asBuilt.runs.find((r) => r.id === onRun.runId)!;
    const siteRecords = {
      [run.id]: { kind: 'run' as const, isThisJob: false, installedBy: { jobId: 'job-a', jobTitle: 'Garden speakers' }, installedOn: '2026-05-14', changedBy: [], abandoned: null },
    };
    const vm = buildPacketViewModel({ snapshot: { ...snapshot, siteRecords }, locateUrl });
    const row = vm.engineering.findings[open.indexOf(onRun)]!;
    expect(row.scope).toBe(`About records already in the ground: “${run.label}” (installed May 14, 2026 by “Garden speakers”).`);
    // Without site records (a first packet, or one issued before the site record) nothing is added.
    expect(sut().engineering.findings.every((f) => f.scope === '')).toBe(true);
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
