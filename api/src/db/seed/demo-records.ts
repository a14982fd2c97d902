import type { AsBuilt } from '../../domain/as-built/as-built.schema.js';

import type { Role } from '../../domain/auth/roles.js';

/*
 * Invented demo data: the company, its people, streets, towns and postal codes do not exist. E-mail
 * domains are reserved example domains (RFC 2606).
 */

export const DEMO_COMPANY_NAME = 'Quillmoss Outdoor Audio';

/** Every demo account signs in with this password (printed by `npm start` and in the README). */
export const DEMO_PASSWORD = 'quillmoss-demo-2026';

export const DEMO_USERS: readonly { role: Role; name: string; email: string }[] = [
  { role: 'admin', name: 'Maren Vell', email: 'admin@quillmoss.example' },
  { role: 'office', name: 'Tobin Ashgrove', email: 'office@quillmoss.example' },
  { role: 'lead', name: 'Rafe Linwood', email: 'lead@quillmoss.example' },
  { role: 'tech', name: 'Ines Carrow', email: 'tech@quillmoss.example' },
  { role: 'homeowner', name: 'Dara Penhallow', email: 'dara.penhallow@example.net' },
];

const emailOf = (role: Role) => DEMO_USERS.find((u) => u.role === role)!.email;

export const DEMO_EMAILS = {
  office: emailOf('office'),
  lead: emailOf('lead'),
  tech: emailOf('tech'),
  homeowner: emailOf('homeowner'),
} as const;

export interface DemoSite {
  customer: { name: string; email: string; phone: string };
  site: {
    label: string;
    addressLine1: string;
    city: string;
    region: string;
    postalCode: string;
    country: string;
    northAzimuthDeg: number;
    originLat: number | null;
    originLon: number | null;
  };
}

export const DEMO_SITES = {
  recorded: {
    customer: { name: 'Dara Penhallow', email: 'dara.penhallow@example.net', phone: '555-0142' },
    site: {
      label: 'Penhallow back yard',
      addressLine1: '17 Thistlewhim Lane',
      city: 'Quellbrook',
      region: 'Mossmere County',
      postalCode: 'QX-0017',
      country: 'Examplia',
      northAzimuthDeg: 12,
      originLat: 40,
      originLon: -105,
    },
  },
  inProgress: {
    customer: { name: 'Ambrose Kettlewick', email: 'ambrose.kettlewick@example.org', phone: '555-0175' },
    site: {
      label: 'Kettlewick pool deck',
      addressLine1: '4 Fernspindle Court',
      city: 'Lower Brackenhythe',
      region: 'Mossmere County',
      postalCode: 'QX-0404',
      country: 'Examplia',
      northAzimuthDeg: 0,
      originLat: null,
      originLon: null,
    },
  },
  draft: {
    customer: { name: 'Sorrel Vantillow', email: 'sorrel.vantillow@example.com', phone: '555-0198' },
    site: {
      label: 'Vantillow garden terrace',
      addressLine1: '9 Glimmerbrook Road',
      city: 'Otterfold-on-Wend',
      region: 'Wendshire',
      postalCode: 'QX-0909',
      country: 'Examplia',
      northAzimuthDeg: -20,
      originLat: null,
      originLon: null,
    },
  },
} satisfies Record<string, DemoSite>;

const POOL = { amplifierItemId: 'amp', channelId: 'ch-pool' } as const;

/** Half of a pool-deck job: the amplifier, a wall entry, two satellites and their runs, some depths. */
export const IN_PROGRESS_AS_BUILT: AsBuilt = {
  zones: [{ id: 'zone-pool', name: 'Pool deck' }],
  referencePoints: [
    { id: 'rp-corner', label: 'House corner, pool side', x: 0, y: 0 },
    { id: 'rp-post', label: 'Pergola post', x: 9, y: 6 },
  ],
  items: [
    {
      id: 'amp',
      kind: 'amplifier',
      label: 'Pool amplifier',
      model: 'Fieldtone A-250',
      channels: [
        { id: 'ch-pool', name: 'Pool deck' },
        { id: 'ch-spare', name: 'Unused' },
      ],
      ratedWatts8Ohm: 50,
      ratedWatts4Ohm: 80,
      minimumImpedanceOhm: 4,
      position: { x: 2, y: -2, source: 'manual', accuracyM: 0.5 },
    },
    {
      id: 'we',
      kind: 'wall_entry',
      label: 'Garage wall entry',
      position: { x: 2, y: 0, source: 'manual', accuracyM: 0.2 },
      wallMaterial: 'block',
      sleeve: '1/2 in PVC',
      sealant: 'duct seal',
    },
    {
      id: 'sp-1',
      kind: 'speaker',
      label: 'Pool satellite 1',
      model: 'Grove S5 (8 Ω)',
      zoneId: 'zone-pool',
      nominalImpedanceOhm: 8,
      ties: [
        { referencePointId: 'rp-corner', distanceM: 6.4 },
        { referencePointId: 'rp-post', distanceM: 5.2 },
      ],
      sideHint: 'left',
    },
    {
      id: 'sp-2',
      kind: 'speaker',
      label: 'Pool satellite 2',
      model: 'Grove S5 (8 Ω)',
      zoneId: 'zone-pool',
      nominalImpedanceOhm: 8,
    },
  ],
  runs: [
    {
      id: 'run-in',
      label: 'Amp to garage wall entry',
      fromItemId: 'amp',
      toItemId: 'we',
      cableType: '14/2 in-wall CL2',
      gauge: { system: 'awg', awg: 14 },
      conductors: 2,
      pairs: [{ pairIndex: 1, channel: POOL }],
      measuredLengthM: 3,
      method: 'indoor',
    },
    {
      id: 'run-1',
      label: 'Wall entry to satellite 1',
      fromItemId: 'we',
      toItemId: 'sp-1',
      cableType: '14/2 direct burial',
      gauge: { system: 'awg', awg: 14 },
      conductors: 2,
      pairs: [{ pairIndex: 1, channel: POOL }],
      measuredLengthM: 7.5,
      method: 'direct_burial',
      depthReadings: [
        { stationM: 2, depthM: 0.2 },
        { stationM: 5, depthM: 0.22 },
      ],
    },
  ],
  checks: [],
};
