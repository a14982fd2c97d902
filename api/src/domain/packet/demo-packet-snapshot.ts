import { analyzeAsBuilt } from '../analysis/analyze.js';
import type { AsBuilt } from '../as-built/as-built.schema.js';
import { DEMO_AS_BUILT } from '../as-built/demo-as-built.js';
import type { PacketSettings, PacketSnapshot } from './packet-snapshot.js';

/**
 * The demo job as an issued snapshot (invented company, people and address), for the view-model tests,
 * the print tests and the benchmark. `asBuilt` and `settings` may be swapped to vary it.
 */
export function demoPacketSnapshot(overrides: { asBuilt?: AsBuilt; settings?: Partial<PacketSettings>; revision?: number } = {}): PacketSnapshot {
  const asBuilt = overrides.asBuilt ?? DEMO_AS_BUILT;
  const amp = asBuilt.items.find((i) => i.kind === 'amplifier');
  const channelSetups =
    amp?.kind === 'amplifier'
      ? Object.fromEntries(
          amp.channels.map((c, i) => [
            c.id,
            {
              source: i === 0 ? 'Streamer, living room' : 'Streamer, living room (zone 2)',
              gain: '2 o’clock',
              volumeLimit: i === 0 ? '80 %' : '70 %',
              eq: 'Flat',
              crossover: i === 0 ? 'Sub low-pass 80 Hz' : 'Off',
              polarity: 'normal' as const,
              firmware: '3.2.1',
              networkName: 'Backyard-Amp',
              notes: null,
            },
          ]),
        )
      : {};
  return {
    format: 1,
    revision: overrides.revision ?? 1,
    issuedAt: '2026-05-20T16:05:00.000Z',
    issuedBy: { id: '00000000-0000-4000-8000-000000000002', name: 'Morgan Office' },
    company: { id: '00000000-0000-4000-8000-000000000001', name: 'Quillmoss Outdoor Audio' },
    settings: {
      paperSize: 'letter',
      units: 'imperial',
      licenceNumbers: ['Low-voltage contractor licence LV-000000 (invented)'],
      contactPhone: '(555) 010-0199',
      contactEmail: 'service@quillmoss.example',
      ...overrides.settings,
    },
    job: { id: '00000000-0000-4000-8000-000000000003', title: 'Rear-yard audio', startDate: '2026-05-12', endDate: '2026-05-14', notes: null },
    site: {
      id: '00000000-0000-4000-8000-000000000004',
      label: 'Penhallow residence',
      addressLine1: '14 Larkspur Way',
      addressLine2: null,
      city: 'Nowhereton',
      region: 'CO',
      postalCode: '00000',
      country: 'United States',
    },
    customer: { id: '00000000-0000-4000-8000-000000000005', name: 'Dara Penhallow', email: 'dara.penhallow@example.net', phone: null },
    crewLead: { id: '00000000-0000-4000-8000-000000000006', name: 'Riley Crewlead' },
    technicians: [],
    asBuilt,
    analysis: analyzeAsBuilt(asBuilt),
    channelSetups,
  };
}
