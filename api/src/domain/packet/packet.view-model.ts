import { FINDING_SEVERITY_LABELS, type Finding, findingText } from '../analysis/finding.js';
import { findingScope, findingScopeText } from '../analysis/finding-scope.js';
import type { Item, ItemKind } from '../as-built/item.schema.js';
import type { InstallMethod } from '../as-built/run.schema.js';
import { type FindingAcknowledgement, findingKey, homeownerException } from './known-exceptions.js';
import { beforeYouDigHeading, filledCaution, LOCATE_STEPS, ONE_CALL_US, SAFETY_CAUTIONS, TOLERANCE_ZONE_M } from './packet-cautions.js';
import { type DateStyle, formatDate, formatDateTime } from '../format/date-time.js';
import { formatDepthLength, formatGroundLength, formatRuleDepth, formatToleranceZone, trimNumber } from '../format/length.js';
import { formatConductor, formatDecibels, formatResistance, formatWatts } from '../format/quantity.js';
import type { PacketPhoto, PacketSignature, PacketSnapshot, PacketUnits } from './packet-snapshot.js';
import { type WhatChangedView, whatChangedView } from './what-changed.js';

/**
 * The sections of the packet, in print order (PRODUCT.md "The handover packet"). The homeowner's pages
 * come first; the Engineering notes appendix is last. A section with nothing recorded is left out of
 * the packet and its contents (`isPresent` in the view model); the others say so in one line.
 */
export const PACKET_SECTIONS = [
  { id: 'summary', title: 'System summary' },
  { id: 'known-exceptions', title: 'Known exceptions' },
  { id: 'what-changed', title: 'What changed' },
  { id: 'site-plan', title: 'Site plan' },
  { id: 'ties', title: 'Ties' },
  { id: 'wiring', title: 'Wiring schematic' },
  { id: 'equipment', title: 'Equipment schedule' },
  { id: 'cables', title: 'Cable schedule' },
  { id: 'depth-profiles', title: 'Depth profiles' },
  { id: 'wall-entries', title: 'Wall entries' },
  { id: 'amplifier', title: 'Amplifier setup' },
  { id: 'commissioning', title: 'Commissioning results' },
  { id: 'locate', title: 'Locate before digging' },
  { id: 'cautions', title: 'Safety cautions' },
  { id: 'care', title: 'Care and maintenance' },
  { id: 'photos', title: 'Photo appendix' },
  { id: 'sign-off', title: 'Sign-off' },
  { id: 'engineering', title: 'Engineering notes' },
] as const;
export type PacketSectionId = (typeof PACKET_SECTIONS)[number]['id'];

export interface TextPair {
  title: string;
  body: string;
}

export interface LabelValue {
  label: string;
  value: string;
}

export interface PacketViewModel {
  paper: { size: 'letter' | 'a4'; cssSize: 'Letter' | 'A4'; name: string };
  units: PacketUnits;
  /** Text of the running footer (left part); the renderer adds "Page x of y". */
  footerText: string;
  /** Title of the PDF document. */
  documentTitle: string;
  cover: {
    companyName: string;
    licences: string[];
    contact: string[];
    jobTitle: string;
    siteLabel: string;
    addressLines: string[];
    customerName: string;
    revisionLabel: string;
    issuedDate: string;
    issuedBy: string;
    crewLead: string;
    workDates: string;
    locateUrl: string;
  };
  /** The printed sections only, numbered in order. */
  toc: { number: string; id: PacketSectionId; title: string; page: string }[];
  /** Each printed section's number (absent sections are not printed at all). */
  num: Partial<Record<PacketSectionId, string>>;
  summary: {
    facts: LabelValue[];
    zones: string;
    /** One plain line about known exceptions (empty when there are none). */
    exceptionsNote: string;
    channels: { name: string; amplifier: string; speakers: string; status: string; statusClass: string }[];
    cableTotals: { cableType: string; runs: string; length: string; spare: string }[];
  };
  knownExceptions: { text: string; reason: string }[];
  /** Against the site's previous packet, which this one supersedes (null for a site's first packet). */
  whatChanged: WhatChangedView | null;
  /** The appendix for whoever services the system: full figures, findings in engineering terms, method. */
  engineering: {
    findingCounts: string;
    /** `scope`: which records already in the ground a finding is also about (issue 21), or empty. */
    findings: { severity: string; severityClass: string; message: string; acknowledged: string; scope: string }[];
    hasFindings: boolean;
    channels: {
      name: string;
      amplifier: string;
      load: string;
      loadWithCable: string;
      minimum: string;
      output: string;
      worstLoss: string;
      status: string;
      statusClass: string;
    }[];
    assumptions: string[];
  };
  sitePlan: { scaleNote: string; legend: LabelValue[] };
  /** The ties sheet's table: each taped distance from a reference point to an item, in the company's units. */
  ties: { note: string; rows: { item: string; reference: string; distance: string }[] };
  equipment: {
    rows: { label: string; kind: string; zone: string; model: string; serial: string; installed: string; warrantyEnd: string }[];
  };
  cables: {
    rows: {
      label: string;
      route: string;
      cableType: string;
      gauge: string;
      length: string;
      method: string;
      minDepth: string;
      maxDepth: string;
      spare: string;
      depthStatus: string;
      depthClass: string;
    }[];
    profileRunIds: { runId: string; label: string; caption: string }[];
    hasProfiles: boolean;
  };
  wallEntries: {
    rows: { label: string; wall: string; hole: string; sleeve: string; sealant: string; inside: string; outside: string; notes: string }[];
    hasRows: boolean;
  };
  amplifiers: {
    label: string;
    model: string;
    serial: string;
    rating: string;
    notes: string;
    channels: { name: string; settings: LabelValue[]; isEmpty: boolean }[];
  }[];
  commissioning: {
    rows: { channel: string; quantity: string; measured: string; expected: string; range: string; result: string; resultClass: string; explanation: string }[];
    hasRows: boolean;
    deviationCount: string;
  };
  /** `heading`: the "Before you dig" call-out, spelled for the locale. */
  locate: { heading: string; steps: TextPair[]; toleranceZone: string; oneCall: string; installerContact: string[]; privateNote: string };
  cautions: TextPair[];
  care: TextPair[];
  photos: { caption: string; takenAt: string; dataUri: string }[];
  hasPhotos: boolean;
  signOff: {
    /** Only the signatures collected; unsigned roles are left out and `unsignedNote` says so in one line. */
    signatures: SignatureView[];
    unsignedNote: string;
    statement: string;
  };
}

export interface SignatureView {
  role: string;
  name: string;
  isSigned: boolean;
  signedAt: string;
  svgPath: string;
}

export interface PacketViewModelInput {
  snapshot: PacketSnapshot;
  /** Absolute URL the cover's QR code encodes (the locate view of this revision). */
  locateUrl: string;
  photos?: readonly PacketPhoto[];
  signatures?: readonly PacketSignature[];
  /** Page number of each section, from the renderer's first pass; unknown pages print as "–". */
  pageNumbers?: Partial<Record<PacketSectionId, number>>;
}

const KIND_LABELS: Record<ItemKind, string> = {
  amplifier: 'Amplifier',
  speaker: 'Speaker',
  subwoofer: 'Subwoofer',
  junction: 'Splice / junction',
  spare_end: 'Spare end',
  wall_entry: 'Wall entry',
};

const METHOD_LABELS: Record<InstallMethod, string> = {
  direct_burial: 'Direct burial',
  conduit: 'In conduit',
  under_hardscape_sleeve: 'Sleeve under hardscape',
  indoor: 'Indoor',
};


const CHECK_RESULT_LABELS: Record<string, string> = {
  ok: 'Within range',
  low: 'Lower than expected',
  high: 'Higher than expected',
  short: 'Short circuit',
  open: 'Open circuit',
  not_comparable: 'Not compared',
};

/** Care and maintenance advice, our own wording (common practice for buried low-voltage audio). */
export const CARE_AND_MAINTENANCE: readonly TextPair[] = [
  {
    title: 'Keep this packet with the house',
    body: 'Store the printed packet and the archive file with the property records and give both to the next owner. Anyone who digs in the yard needs the site plan.',
  },
  {
    title: 'Speakers and subwoofer',
    body: 'Keep mulch, soil and irrigation spray off speaker grilles and the subwoofer port. Clear leaves and debris from the port seasonally, and keep the area around it free of standing water.',
  },
  {
    title: 'Amplifier',
    body: 'Keep the amplifier ventilated and dust-free, and do not stack equipment on it. The settings on the amplifier setup pages were chosen for this system; note any change you make.',
  },
  {
    title: 'Before you plant, edge or aerate',
    body: 'Check the site plan before planting trees or shrubs, installing edging, aerating, or driving stakes near a route. Core aerators and edgers reach deeper than you might expect.',
  },
  {
    title: 'Spare cable',
    body: 'The spare run and capped pairs shown in the cable schedule are ready for future speakers or lights. Their ends are marked on the site plan; keep them capped and dry.',
  },
  {
    title: 'Service',
    body: 'If a speaker goes quiet or distorts after digging nearby, stop using that channel and call the installer: a nicked cable can short the amplifier output.',
  },
];

const dash = (value: string | null | undefined): string => (value === undefined || value === null || value.trim() === '' ? '—' : value);

function itemLabel(items: ReadonlyMap<string, Item>, id: string): string {
  return items.get(id)?.label ?? 'unknown item';
}

function siteAddressLines(site: PacketSnapshot['site']): string[] {
  const cityLine = [site.city, [site.region, site.postalCode].filter(Boolean).join(' ')].filter(Boolean).join(', ');
  return [site.addressLine1, site.addressLine2 ?? '', cityLine, site.country].filter((line) => line.trim() !== '');
}

const present = (v: string | null | undefined): v is string => !!v && v.trim() !== '';

/** The installer's contact as printed: phone, e-mail, website, then the postal address line by line. */
function contactLines(snapshot: PacketSnapshot): string[] {
  const { settings } = snapshot;
  const address = (settings.postalAddress ?? '').split(/\r?\n/).map((line) => line.trim());
  return [settings.contactPhone, settings.contactEmail, settings.website, ...address].filter(present);
}

/** The running footer's left part: the installer's name and phone on every page, then site and revision. */
function footerText(snapshot: PacketSnapshot, revisionLabel: string, issuedDate: string): string {
  const phone = snapshot.settings.contactPhone;
  return [snapshot.company.name, present(phone) ? phone.trim() : null, snapshot.site.label, `${revisionLabel}, ${issuedDate}`].filter(present).join(' · ');
}

/** The locate page's installer block: who to call first, with the number when the profile has one. */
function installerContact(snapshot: PacketSnapshot): string[] {
  const phone = snapshot.settings.contactPhone;
  const call = present(phone) ? `Call the installer: ${phone.trim()}` : 'Call the installer (no phone number was on file when this packet was issued)';
  return [snapshot.company.name, call, ...contactLines(snapshot).filter((line) => line !== phone)];
}

function signatureView(role: 'lead' | 'homeowner', signature: PacketSignature, dates: DateStyle): SignatureView {
  return {
    role: role === 'lead' ? 'Crew lead' : 'Homeowner',
    name: signature.signerName,
    isSigned: true,
    signedAt: formatDateTime(signature.signedAt, dates),
    svgPath: signature.svgPath,
  };
}

/**
 * Builds everything the packet template prints from an issued snapshot: every number already in the
 * company's units and every date written out in the company's time zone and locale, so the template holds
 * no logic. Pure: the same input gives the same output (no clock, no server locale or zone).
 */
export function buildPacketViewModel(input: PacketViewModelInput): PacketViewModel {
  const { snapshot } = input;
  const { asBuilt, analysis, settings } = snapshot;
  const units = settings.units;
  const items = new Map(asBuilt.items.map((item) => [item.id, item]));
  const zones = new Map(asBuilt.zones.map((zone) => [zone.id, zone.name]));
  const depthByRun = new Map(analysis.depth.map((d) => [d.runId, d]));
  const channelNames = new Map<string, string>();
  for (const item of asBuilt.items) {
    if (item.kind === 'amplifier') for (const channel of item.channels) channelNames.set(channel.id, `${channel.name} (${item.label})`);
  }
  // CGA's 18 in, written as the trade states it in each system (0.46 m rounds to the usual 0.5 m).
  const toleranceZone = formatToleranceZone(TOLERANCE_ZONE_M, units);
  // The zone in the packet's units, and words spelled for the company's locale (en-US "center" by default).
  const cautionFill = { zone: toleranceZone, locale: settings.locale ?? null };

  const revisionLabel = `Revision ${snapshot.revision}`;
  // Dates in the company's time zone and locale (an evening issue in the Americas prints that day).
  const dates: DateStyle = { timeZone: settings.timeZone ?? null, locale: settings.locale ?? null };
  const issuedDate = formatDate(snapshot.issuedAt, dates);
  const crewLead = snapshot.crewLead?.name ?? 'Not assigned';
  const isPaperA4 = settings.paperSize === 'a4';

  const findings = analysis.findings.filter((f) => f.severity !== 'info');
  const acknowledgements: readonly FindingAcknowledgement[] = snapshot.acknowledgements ?? [];
  const acknowledged = new Map(acknowledgements.map((a) => [`${a.code}@${a.path}`, a]));
  const findingByKey = new Map(analysis.findings.map((f) => [findingKey(f), f]));
  const knownExceptions = acknowledgements.map((a) => ({
    text: homeownerException(a, findingByKey.get(`${a.code}@${a.path}`), asBuilt, units),
    reason: a.reason,
  }));
  const photos = input.photos ?? [];
  const referenceLabels = new Map(asBuilt.referencePoints.map((rp) => [rp.id, rp.label]));
  const tieRows = asBuilt.items.flatMap((item) =>
    (item.ties ?? []).flatMap((tie) => {
      const reference = referenceLabels.get(tie.referencePointId);
      return reference === undefined ? [] : [{ item: item.label, reference, distance: formatGroundLength(tie.distanceM, units) }];
    }),
  );
  const signatures = (['lead', 'homeowner'] as const).flatMap((role) => {
    const signature = input.signatures?.find((s) => s.role === role);
    return signature ? [signatureView(role, signature, dates)] : [];
  });
  const isPresent: Record<PacketSectionId, boolean> = {
    summary: true,
    'known-exceptions': knownExceptions.length > 0,
    'what-changed': snapshot.whatChanged !== undefined,
    'site-plan': true,
    ties: tieRows.length > 0,
    wiring: true,
    equipment: true,
    cables: true,
    'depth-profiles': asBuilt.runs.some((run) => !run.isAbandoned && run.method !== 'indoor' && (run.depthReadings?.length ?? 0) > 0),
    'wall-entries': asBuilt.items.some((item) => item.kind === 'wall_entry'),
    amplifier: asBuilt.items.some((item) => item.kind === 'amplifier'),
    commissioning: true,
    locate: true,
    cautions: true,
    care: true,
    photos: photos.length > 0,
    'sign-off': true,
    engineering: true,
  };
  const printed = PACKET_SECTIONS.filter((section) => isPresent[section.id]);
  const { summary } = analysis;

  const liveRuns = asBuilt.runs.filter((r) => !r.isAbandoned);

  return {
    paper: { size: settings.paperSize, cssSize: isPaperA4 ? 'A4' : 'Letter', name: isPaperA4 ? 'A4' : 'US Letter' },
    units,
    footerText: footerText(snapshot, revisionLabel, issuedDate),
    documentTitle: `Handover packet — ${snapshot.job.title} — ${revisionLabel}`,
    cover: {
      companyName: snapshot.company.name,
      licences: settings.licenceNumbers,
      contact: contactLines(snapshot),
      jobTitle: snapshot.job.title,
      siteLabel: snapshot.site.label,
      addressLines: siteAddressLines(snapshot.site),
      customerName: snapshot.customer.name,
      revisionLabel,
      issuedDate,
      issuedBy: snapshot.issuedBy?.name ?? '—',
      crewLead,
      workDates:
        snapshot.job.startDate && snapshot.job.endDate && snapshot.job.startDate !== snapshot.job.endDate
          ? `${formatDate(snapshot.job.startDate, dates)} – ${formatDate(snapshot.job.endDate, dates)}`
          : formatDate(snapshot.job.endDate ?? snapshot.job.startDate, dates),
      locateUrl: input.locateUrl,
    },
    toc: printed.map((section, i) => {
      const page = input.pageNumbers?.[section.id];
      return { number: String(i + 1), id: section.id, title: section.title, page: page === undefined ? '–' : String(page) };
    }),
    num: Object.fromEntries(printed.map((section, i) => [section.id, String(i + 1)])),
    summary: {
      facts: [
        { label: 'Equipment items', value: String(summary.itemCount) },
        { label: 'Cable runs', value: String(summary.runCount) },
        { label: 'Cable installed', value: formatGroundLength(summary.totalCableM, units) },
        { label: 'Amplifier channels', value: String(analysis.channels.length) },
        { label: 'Commissioning checks', value: String(analysis.checks.length) },
        { label: 'Crew lead', value: crewLead },
      ],
      zones: asBuilt.zones.length > 0 ? asBuilt.zones.map((z) => z.name).join(', ') : '—',
      exceptionsNote:
        knownExceptions.length === 0
          ? ''
          : knownExceptions.length === 1
            ? 'One known exception is described on the next page.'
            : `${knownExceptions.length} known exceptions are described on the next page.`,
      channels: analysis.channels.map((c) => {
        const isBelow = c.loadOhmNominal !== null && c.loadOhmNominal < c.minimumImpedanceOhm - 1e-9;
        const speakers = c.loads.length;
        return {
          name: c.channelName,
          amplifier: itemLabel(items, c.channel.amplifierItemId),
          speakers: speakers === 0 ? 'None' : speakers === 1 ? '1 speaker' : `${speakers} speakers`,
          status:
            isBelow && acknowledgements.some((a) => a.code === 'LOAD_BELOW_AMP_MINIMUM')
              ? 'Known exception'
              : !c.isSolved || isBelow
                ? 'See Engineering notes'
                : c.loadOhmNominal === null
                  ? 'Nothing connected'
                  : 'Working as designed',
          statusClass: !c.isSolved || isBelow || c.loadOhmNominal === null ? 'bad' : 'ok',
        };
      }),
      cableTotals: analysis.cableTotals.map((t) => ({
        cableType: t.cableType,
        runs: String(t.runCount),
        length: formatGroundLength(t.lengthM, units),
        spare: t.spareLengthM > 0 ? formatGroundLength(t.spareLengthM, units) : '—',
      })),
    },
    knownExceptions,
    whatChanged: whatChangedView(snapshot),
    engineering: {
      findingCounts:
        summary.critical + summary.warning === 0
          ? 'No open findings.'
          : `${summary.critical} to fix, ${summary.warning} to check at issue.`,
      findings: findings.map((f) => {
        const ack = acknowledged.get(findingKey(f));
        // Said only when earlier jobs' records are involved: on a site's first job every finding is its own.
        const scope = findingScope(f, asBuilt, snapshot.siteRecords);
        return {
          severity: FINDING_SEVERITY_LABELS[f.severity],
          severityClass: f.severity,
          message: findingText(f, units),
          acknowledged: ack ? `Acknowledged at issue: ${ack.reason}` : '',
          scope: scope && scope.earlier.length > 0 ? findingScopeText(scope, dates) : '',
        };
      }),
      hasFindings: findings.length > 0,
      channels: analysis.channels.map((c) => {
        const worst = c.loads.reduce((max, l) => Math.max(max, l.cableLossDb), 0);
        const isBelow = c.loadOhmNominal !== null && c.loadOhmNominal < c.minimumImpedanceOhm - 1e-9;
        return {
          name: c.channelName,
          amplifier: itemLabel(items, c.channel.amplifierItemId),
          load: c.mode === 'constant_voltage' && c.cv ? `${formatWatts(c.cv.totalTapWatts)} taps` : formatResistance(c.loadOhmNominal),
          loadWithCable: formatResistance(c.loadOhmWithCable),
          minimum: formatResistance(c.minimumImpedanceOhm),
          output: formatWatts(c.amplifierOutputW),
          worstLoss: c.loads.length > 0 ? formatDecibels(worst) : '—',
          cableShare: c.loads.length > 0 ? `${c.cableDissipationPct.toFixed(1)} %` : '—',
          status: !c.isSolved ? 'Not solved' : isBelow ? 'Below amplifier minimum' : c.loadOhmNominal === null ? 'Nothing connected' : 'OK',
          statusClass: !c.isSolved || isBelow || c.loadOhmNominal === null ? 'bad' : 'ok',
        };
      }),
      assumptions: analysis.assumptions.notes,
    },
    sitePlan: {
      scaleNote: 'Positions are as recorded from tape ties and plan placement; verify by hand-digging before any excavation.',
      legend: [],
    },
    ties: {
      note: 'Each item was placed by taping its distance from fixed reference points. To find an item again, tape the same distances from two of its points: it lies where they meet.',
      rows: tieRows,
    },
    equipment: {
      rows: asBuilt.items
        .filter((item) => item.kind !== 'wall_entry')
        .map((item) => ({
          label: item.label,
          kind: KIND_LABELS[item.kind],
          zone: item.zoneId ? dash(zones.get(item.zoneId)) : '—',
          model: dash(item.model),
          serial: dash(item.serial),
          installed: formatDate(item.installDate, dates),
          warrantyEnd: formatDate(item.warrantyEnd, dates),
        })),
    },
    cables: {
      rows: asBuilt.runs.map((run) => {
        const depth = depthByRun.get(run.id);
        const status = run.isAbandoned
          ? 'Abandoned'
          : depth?.status === 'shallow'
            ? 'Shallow reading'
            : depth?.status === 'not_recorded'
              ? 'Not recorded'
              : depth?.status === 'not_buried'
                ? 'Not buried'
                : depth?.status === 'ok'
                  ? 'OK'
                  : '—';
        return {
          label: run.label,
          route: `from ${itemLabel(items, run.fromItemId)} to ${itemLabel(items, run.toItemId)}`,
          cableType: run.cableType,
          gauge: `${formatConductor(run.gauge, units)}, ${run.conductors}-cond.`,
          length: formatGroundLength(run.measuredLengthM, units),
          method: METHOD_LABELS[run.method],
          minDepth: depth?.minDepthM != null ? formatDepthLength(depth.minDepthM, units) : '—',
          maxDepth: depth?.maxDepthM != null ? formatDepthLength(depth.maxDepthM, units) : '—',
          spare: run.isSpare ? 'Spare run' : run.pairs.some((p) => p.channel === null) ? 'Spare pair' : '—',
          depthStatus: status,
          depthClass: status === 'Shallow reading' || status === 'Not recorded' ? 'bad' : 'ok',
        };
      }),
      profileRunIds: liveRuns
        .filter((run) => run.method !== 'indoor' && (run.depthReadings?.length ?? 0) > 0)
        .map((run) => {
          const depth = depthByRun.get(run.id);
          const rule = depth?.rule?.minCoverM != null ? `; rule minimum ${formatRuleDepth(depth.rule.minCoverM, units)}` : '';
          return {
            runId: run.id,
            label: run.label,
            caption: `${formatGroundLength(run.measuredLengthM, units)}, ${run.depthReadings?.length ?? 0} reading(s)${rule}`,
          };
        }),
      hasProfiles: liveRuns.some((run) => run.method !== 'indoor' && (run.depthReadings?.length ?? 0) > 0),
    },
    wallEntries: (() => {
      const rows = asBuilt.items
        .filter((item) => item.kind === 'wall_entry')
        .map((item) => {
          const entry = item as Extract<Item, { kind: 'wall_entry' }>;
          return {
            label: entry.label,
            wall: dash(entry.wallMaterial),
            hole:
              entry.holeDiameterM === undefined
                ? '—'
                : formatDepthLength(entry.holeDiameterM, units),
            sleeve: dash(entry.sleeve),
            sealant: dash(entry.sealant),
            inside: dash(entry.insideLocation),
            outside: dash(entry.outsideLocation),
            notes: dash(entry.notes),
          };
        });
      return { rows, hasRows: rows.length > 0 };
    })(),
    amplifiers: asBuilt.items
      .filter((item): item is Extract<Item, { kind: 'amplifier' }> => item.kind === 'amplifier')
      .map((amp) => ({
        label: amp.label,
        model: dash(amp.model),
        serial: dash(amp.serial),
        rating: [
          `${formatWatts(amp.ratedWatts8Ohm)} per channel into 8 Ω`,
          amp.ratedWatts4Ohm !== undefined ? `${formatWatts(amp.ratedWatts4Ohm)} into 4 Ω` : '',
          `stable to ${formatResistance(amp.minimumImpedanceOhm)}`,
        ]
          .filter(Boolean)
          .join(', '),
        notes: dash(amp.notes),
        channels: amp.channels.map((channel) => {
          const setup = snapshot.channelSetups[channel.id];
          const load = analysis.channels.find((c) => c.channel.channelId === channel.id);
          // Only what was recorded prints: rows of dashes for settings nobody wrote down help no one.
          const settings = [
              { label: 'Load', value: load ? formatResistance(load.loadOhmNominal) : '—' },
              ...(channel.constantVoltage
                ? [{ label: 'Line', value: `${channel.constantVoltage.lineVoltage}, rated ${formatWatts(channel.constantVoltage.ratedWatts)}` }]
                : []),
              { label: 'Source', value: dash(setup?.source) },
              { label: 'Gain', value: dash(setup?.gain) },
              { label: 'Volume limit', value: dash(setup?.volumeLimit) },
              { label: 'EQ', value: dash(setup?.eq) },
              { label: 'Crossover', value: dash(setup?.crossover) },
              { label: 'Polarity', value: setup?.polarity ? (setup.polarity === 'normal' ? 'Normal' : 'Inverted') : '—' },
              { label: 'Firmware', value: dash(setup?.firmware) },
              { label: 'Network name', value: dash(setup?.networkName) },
              { label: 'Notes', value: dash(setup?.notes) },
            ].filter((row) => row.label === 'Load' || row.value !== '—');
          return { name: channel.name, settings, isEmpty: settings.length <= 1 };
        }),
      })),
    commissioning: (() => {
      const rows = analysis.checks.map((check) => ({
        channel: channelNames.get(check.channel.channelId) ?? 'unknown channel',
        quantity: check.quantity === 'dc_resistance' ? 'DC resistance' : 'Impedance',
        measured: formatResistance(check.measuredOhm),
        expected: check.expectedOhm === null ? '—' : formatResistance(check.expectedOhm),
        range:
          check.expectedLowOhm === null || check.expectedHighOhm === null
            ? '—'
            : `${trimNumber(check.expectedLowOhm, 2)}–${formatResistance(check.expectedHighOhm)}`,
        result: CHECK_RESULT_LABELS[check.status] ?? check.status,
        resultClass: check.status === 'ok' ? 'ok' : check.status === 'not_comparable' ? 'muted' : 'bad',
        explanation: check.explanation,
      }));
      const deviations = analysis.checks.filter((c) => c.status !== 'ok' && c.status !== 'not_comparable').length;
      return {
        rows,
        hasRows: rows.length > 0,
        deviationCount:
          rows.length === 0
            ? 'No commissioning checks were recorded.'
            : deviations === 0
              ? `All ${rows.length} readings are within the expected range.`
              : `${deviations} of ${rows.length} readings differ from the computed value.`,
      };
    })(),
    locate: {
      heading: beforeYouDigHeading(settings.locale ?? null),
      steps: LOCATE_STEPS.map((s) => filledCaution(s, cautionFill)),
      toleranceZone,
      oneCall: `${ONE_CALL_US.phone} · ${ONE_CALL_US.website}`,
      installerContact: installerContact(snapshot),
      privateNote: 'One-call locators do not mark the cables of this installation: they are private lines.',
    },
    cautions: SAFETY_CAUTIONS.map((c) => filledCaution(c, cautionFill)),
    care: [...CARE_AND_MAINTENANCE],
    photos: photos.map((p) => ({ caption: p.caption, takenAt: p.takenAt ? formatDateTime(p.takenAt, dates) : '', dataUri: p.dataUri })),
    hasPhotos: photos.length > 0,
    signOff: {
      signatures,
      unsignedNote:
        signatures.length === 0
          ? 'The walkthrough was not signed.'
          : signatures.length === 1
            ? `The walkthrough was signed by the ${signatures[0]!.role.toLowerCase()} only.`
            : '',
      statement:
        'The homeowner acknowledges the walkthrough of the system, receipt of this packet, and the locate and safety cautions it contains.',
    },
  };
}
