import type { ChannelRef } from '../as-built/common.schema.js';
import { formatQuantity, type LengthSystem, type Quantity } from '../format/length.js';

export type FindingSeverity = 'info' | 'warning' | 'critical';

/** The one set of words for a finding's severity, on every screen, drawing and printed page. */
export const FINDING_SEVERITY_LABELS: Record<FindingSeverity, string> = { critical: 'Must fix', warning: 'Check', info: 'Note' };

/** A piece of a finding's text: words, or a quantity written at the edge in the reader's units. */
export type FindingPart = string | Quantity;

/**
 * One thing the crew lead or the office should look at. `message` is plain English for a crew lead, with
 * any length written in SI; a finding with lengths in it also carries `parts` (its text as words and
 * quantities), which every place that shows findings writes in the reader's units with
 * {@link findingText} — so an imperial company reads "4 3/8 in of cover … the rule is 6 in".
 * `path` points into the as-built (e.g. ['runs', 3, 'depthReadings', 1]) so a form can highlight the
 * field. `code` is stable (SCREAMING_SNAKE) for clients and tests.
 */
export interface Finding {
  code: FindingCode;
  severity: FindingSeverity;
  message: string;
  /** The message as words and quantities (SI), for {@link findingText}; absent when it holds no length. */
  parts?: FindingPart[];
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

/** Quantity builders for {@link composeMessage}. */
export const qty = {
  /** A length along the ground (station, tie, run length, position accuracy). */
  length: (m: number): Quantity => ({ kind: 'length', m }),
  /** A measured depth or a shortfall in depth. */
  depth: (m: number): Quantity => ({ kind: 'depth', m }),
  /** A depth rule's required cover. */
  ruleDepth: (m: number): Quantity => ({ kind: 'rule_depth', m }),
};

const isQuantity = (v: unknown): v is Quantity =>
  typeof v === 'object' && v !== null && typeof (v as Quantity).m === 'number' && typeof (v as Quantity).kind === 'string';

/**
 * A finding's text from words and quantities, as a tagged template:
 * composeMessage`Run "${label}" has ${qty.depth(0.11)} of cover` gives `parts` for the reader's units and
 * `message` with the quantities in SI.
 */
export function composeMessage(strings: TemplateStringsArray, ...values: (string | number | Quantity)[]): { message: string; parts: FindingPart[] } {
  const parts: FindingPart[] = [];
  const push = (text: string) => {
    if (text === '') return;
    const last = parts[parts.length - 1];
    if (typeof last === 'string') parts[parts.length - 1] = last + text;
    else parts.push(text);
  };
  strings.forEach((text, i) => {
    push(text);
    if (i < values.length) {
      const value = values[i]!;
      if (isQuantity(value)) parts.push(value);
      else push(String(value));
    }
  });
  return { message: findingText({ message: '', parts }, 'metric'), parts };
}

/**
 * A finding's text in the reader's units (the company's, or the user's own on screens): its `parts` with
 * each quantity written by the one length formatter (domain/format/length), or its `message` when it has
 * no parts (a finding without lengths, or one frozen before findings carried their numbers).
 */
export function findingText(finding: Pick<Finding, 'message' | 'parts'>, system: LengthSystem): string {
  if (!finding.parts || finding.parts.length === 0) return finding.message;
  return finding.parts.map((part) => (typeof part === 'string' ? part : isQuantity(part) ? formatQuantity(part, system) : '')).join('');
}
