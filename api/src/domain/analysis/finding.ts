import type { ChannelRef } from '../as-built/common.schema.js';

export type FindingSeverity = 'info' | 'warning' | 'critical';

/** The one set of words for a finding's severity, on every screen, drawing and printed page. */
export const FINDING_SEVERITY_LABELS: Record<FindingSeverity, string> = { critical: 'Must fix', warning: 'Check', info: 'Note' };

/**
 * One thing the crew lead or the office should look at. `message` is plain English for a crew lead;
 * `path` points into the as-built (e.g. ['runs', 3, 'depthReadings', 1]) so a form can highlight the
 * field. `code` is stable (SCREAMING_SNAKE) for clients and tests.
 */
export interface Finding {
  code: FindingCode;
  severity: FindingSeverity;
  message: string;
  path: (string | number)[];
  itemId?: string;
  runId?: string;
  channel?: ChannelRef;
  /** Numbers behind the message (SI units, unrounded) for display or sorting. */
  data?: Record<string, number | string | boolean | null>;
}

/**
 * Every finding code, stable (SCREAMING_SNAKE) for clients and tests. A runtime list so that a test can
 * check that each code is raised by at least one scenario (`finding-codes.spec.ts`).
 */
export const FINDING_CODES = [
  // loads
  'LOAD_BELOW_AMP_MINIMUM',
  'CHANNEL_SHORT',
  'CHANNEL_OPEN',
  'BRANCH_ENDS_WITHOUT_LOAD',
  'CABLE_LOSS_OVER_LIMIT',
  'SPEAKER_ON_NO_CHANNEL',
  'SPEAKER_ONLY_ON_SPARE_RUN',
  'RUN_NOT_CONNECTED_TO_AMP',
  'LOOP_IN_WIRING',
  'ITEM_ON_TWO_CHANNELS',
  'AMPLIFIER_OUTPUTS_JOINED',
  'CV_TAPS_OVER_HEADROOM',
  'CV_OVERLOAD',
  'CV_LINE_VOLTAGE_MISMATCH',
  'LOW_IMPEDANCE_SPEAKER_ON_CV_LINE',
  'CV_SPEAKER_ON_LOW_IMPEDANCE_CHANNEL',
  'NO_GAUGE_MEETS_LOSS_LIMIT',
  // depth
  'DEPTH_SHALLOW',
  'DEPTH_NOT_RECORDED',
  'DEPTH_NO_RULE',
  'DEPTH_RULE_OVER_30V',
  // geometry
  'POSITION_FROM_TIES_FAILED',
  'POSITION_WEAK_GEOMETRY',
  'POSITION_TIES_DISAGREE',
  'POSITION_SIDE_HINT_MISSING',
  'POSITION_UNKNOWN',
  'ROUTE_LENGTH_MISMATCH',
  // commissioning checks
  'CHECK_READING_LOW',
  'CHECK_READING_HIGH',
  'CHECK_SHORT',
  'CHECK_OPEN',
  'CHECK_NOT_COMPARABLE',
  'CHECK_POLARITY',
  'CHECK_INSULATION',
] as const;

export type FindingCode = (typeof FINDING_CODES)[number];

const severityRank: Record<FindingSeverity, number> = { critical: 0, warning: 1, info: 2 };

/** Sorts findings most severe first, then by code, then by path (stable, deterministic output). */
export function sortFindings(findings: Finding[]): Finding[] {
  return findings.sort(
    (a, b) =>
      severityRank[a.severity] - severityRank[b.severity] ||
      a.code.localeCompare(b.code) ||
      a.path.join('.').localeCompare(b.path.join('.')),
  );
}

/** Formats a number for a message with at most `digits` decimals, trimming trailing zeros. */
export function fmt(value: number, digits = 2): string {
  if (!Number.isFinite(value)) return value > 0 ? 'open (infinite)' : String(value);
  return String(Number(value.toFixed(digits)));
}
