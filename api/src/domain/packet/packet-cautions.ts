/**
 * The dig-safety and scope cautions printed in every packet, in our own words. The facts behind them,
 * with their sources (copied from the project's reference notes; nothing here is read at run time):
 *
 * - 811 is the U.S. one-call number: FCC Sixth Report and Order FCC 05-59 (CC Docket 92-105), adopted
 *   10 Mar 2005. Notice periods differ by state, e.g. California ≥ 2 working days (Gov. Code 4216.2),
 *   Michigan ≥ 3 business days (MCL 460.725), Texas ≥ 48 h excluding weekends and holidays (Util. Code
 *   251.151) — hence "notice periods vary" rather than one number.
 * - One-call centres notify only their members; privately owned lines (landscape lighting, irrigation,
 *   low-voltage cable, pet fences, power to outbuildings and pool equipment) are not located: CGA Best
 *   Practices 3-32; okie811.org "service / private lines"; JULIE guidance (Farmer City, IL), which also
 *   recommends keeping a drawing of privately installed buried lines and passing it on to later owners.
 * - Tolerance zone: the width of the facility plus 18 in (0.46 m) either side, horizontally (CGA Best
 *   Practice 5-19); states may set wider zones (California 24 in, Gov. Code 4216(u); Michigan caution
 *   zone 48 in, MCL 460.723); Canada's CCGA Best Practice 4-18 uses 1 m. Inside it, expose by hand
 *   digging, soft digging or vacuum excavation (CGA Best Practice 5-20).
 * - Pools and spas: NEC Article 680 governs wiring near pools, spas and hot tubs (e.g. 680.11 / 680.10:
 *   no underground wiring within 5 ft horizontally unless it serves the pool; 680.22 receptacle and
 *   luminaire distances; 680.26 equipotential bonding); audio equipment near pools is addressed by
 *   640.10. Editions and local adoption differ: verify with the authority having jurisdiction.
 * - Colour of paint marks: APWA Uniform Color Code (CGA Best Practices Appendix B): orange for
 *   communication, alarm and signal lines (our speaker and signal cable), white for the limits of a
 *   proposed excavation. The drawings' palette (drawings/marking-palette.ts) follows the same code.
 */

import { spell } from '../format/date-time.js';

export interface CautionText {
  title: string;
  body: string;
}

/** The tolerance zone the packet quotes, metres (CGA Best Practice 5-19: 18 in either side). */
export const TOLERANCE_ZONE_M = 0.4572;

/** The one-call number and website in the U.S. (FCC 05-59); elsewhere the local one-call centre applies. */
export const ONE_CALL_US = { phone: '811', website: 'call811.com' } as const;

/**
 * Safety cautions, in print order. Placeholders, filled by {@link fillCaution}: `{zone}` is the tolerance
 * zone in the reader's units, `{center}` and `{color}` the words as the reader's locale spells them.
 */
export const SAFETY_CAUTIONS: readonly CautionText[] = [
  {
    title: 'Contact the one-call {center} before any digging',
    body: 'Before digging, trenching, driving stakes or posts, or planting trees, contact the one-call {center} (811 in the United States) so utility owners can mark their lines. Notice periods differ by state and country; allow the full period.',
  },
  {
    title: 'One-call services do not mark private lines',
    body: 'The cables in this packet belong to the property owner. One-call locators mark only the lines of their member utilities, so they will not find these cables. This packet is the map: keep it with the property records and pass it on to the next owner.',
  },
  {
    title: 'Hand-dig within the tolerance zone',
    body: 'Within {zone} on either side of a mapped route (or wider where local rules say so), expose cables by careful hand digging or vacuum excavation, not with powered equipment. Positions come from tape measurements and may be off by the stated accuracy.',
  },
  {
    title: 'Depths are as installed',
    body: 'Recorded depths were measured when the trench was open. Grading, landscaping, erosion and settling change the cover over time: never rely on a recorded depth to dig safely.',
  },
  {
    title: 'Pools, spas and water features',
    body: 'Electrical work near pools, spas, hot tubs and fountains is governed by the electrical code (in the U.S., NEC Article 680, which sets clearances, bonding and ground-fault protection) and must be done by a licensed electrician.',
  },
  {
    title: 'Line-voltage work is not part of this installation',
    body: 'This is a low-voltage audio installation. Outlets, circuits and any other line-voltage (mains) wiring that powers the equipment were not part of this work and must be installed and serviced by a licensed electrician.',
  },
  {
    title: 'Local codes come first',
    body: 'Always follow local codes, the authority having jurisdiction and licensed practice. The checks in this packet (cable loss, loads, depths) are our own engineering checks of the recorded installation; they are not a code inspection or approval.',
  },
];

/** The locate-before-digging page: short steps, in print order (placeholders as in SAFETY_CAUTIONS). */
export const LOCATE_STEPS: readonly CautionText[] = [
  {
    title: 'Contact the one-call {center} first',
    body: 'Call 811 (United States) or the local one-call {center} a few working days before you dig. Utility owners will mark public lines with paint or flags.',
  },
  {
    title: 'Then use this packet for the private cables',
    body: 'Find the work area on the site plan. Every buried run, splice, wall entry and spare end of this installation is drawn there, with its recorded depth.',
  },
  {
    title: 'Mark the routes on the ground',
    body: 'Measure from the reference points using the ties on the plan, and mark each cable route with orange paint or flags (orange is the marking {color} for signal and communication cable) before any digging starts.',
  },
  {
    title: 'Outline the dig area in white',
    body: 'Outline the area you plan to dig with white paint or flags (white marks a proposed excavation). Never mark these cable routes in white.',
  },
  {
    title: 'Dig by hand near a route',
    body: 'Inside the tolerance zone of {zone} on each side of a marked route, dig by hand until the cable is exposed. If a cable is damaged, stop and call the installer.',
  },
];

/** A caution's placeholders filled in: the tolerance zone as written for the reader, words spelled for the locale (en-US default). */
export function fillCaution(text: string, fill: { zone: string; locale?: string | null }): string {
  return text
    .replaceAll('{zone}', fill.zone)
    .replaceAll('{center}', spell('center', fill.locale))
    .replaceAll('{color}', spell('color', fill.locale));
}

/** Both texts of a caution filled in (see {@link fillCaution}). */
export function filledCaution(caution: CautionText, fill: { zone: string; locale?: string | null }): CautionText {
  return { title: fillCaution(caution.title, fill), body: fillCaution(caution.body, fill) };
}

/** The packet's "Before you dig" call-out heading, spelled for the locale. */
export function beforeYouDigHeading(locale?: string | null): string {
  return `Before you dig: contact the one-call ${spell('center', locale)}`;
}
