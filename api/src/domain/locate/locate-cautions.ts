import { trimNumber } from '../format/length.js';
import { LOCATE_STEPS, SAFETY_CAUTIONS, TOLERANCE_ZONE_M, type CautionText } from '../packet/packet-cautions.js';
import type { PacketUnits } from '../packet/packet-snapshot.js';

export interface LocateCautions {
  toleranceZone: string;
  locateSteps: CautionText[];
  cautions: CautionText[];
  /** One sentence for e-mails and headers; the full texts say the rest. */
  summary: string;
}

/**
 * The packet's locate steps and safety cautions (the same texts, from packet-cautions.ts) with the
 * tolerance zone written as the packet writes it: 18 in in imperial units, 0.5 m in metric.
 */
export function locateCautions(units: PacketUnits): LocateCautions {
  const toleranceZone = units === 'imperial' ? '18 in' : `${trimNumber(Math.ceil(TOLERANCE_ZONE_M * 10) / 10, 1)} m`;
  const fill = (c: CautionText): CautionText => ({ title: c.title, body: c.body.replaceAll('{zone}', toleranceZone) });
  return {
    toleranceZone,
    locateSteps: LOCATE_STEPS.map(fill),
    cautions: SAFETY_CAUTIONS.map(fill),
    summary: `Before any digging, contact the one-call centre (811 in the United States); one-call locators do not mark these private cables, so use this map and hand-dig within ${toleranceZone} of a mapped route.`,
  };
}
