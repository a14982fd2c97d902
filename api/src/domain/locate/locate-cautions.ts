import { formatToleranceZone } from '../format/length.js';
import { fillCaution, filledCaution, LOCATE_STEPS, SAFETY_CAUTIONS, TOLERANCE_ZONE_M, type CautionText } from '../packet/packet-cautions.js';
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
 * tolerance zone written as the packet writes it (18 in in imperial units, 0.5 m in metric) and words
 * spelled for the company's locale (en-US "center" by default, en-GB "centre").
 */
export function locateCautions(units: PacketUnits, locale?: string | null): LocateCautions {
  const toleranceZone = formatToleranceZone(TOLERANCE_ZONE_M, units);
  const fill = { zone: toleranceZone, locale };
  return {
    toleranceZone,
    locateSteps: LOCATE_STEPS.map((c) => filledCaution(c, fill)),
    cautions: SAFETY_CAUTIONS.map((c) => filledCaution(c, fill)),
    summary: fillCaution(
      'Before any digging, contact the one-call {center} (811 in the United States); one-call locators do not mark these private cables, so use this map and hand-dig within {zone} of a mapped route.',
      fill,
    ),
  };
}
