import { z } from 'zod';

import type { Finding, FindingCode } from '../analysis/finding.js';
import type { AsBuilt } from '../as-built/as-built.schema.js';
import { formatDepthLength, formatGroundLength, formatRuleDepth } from '../format/length.js';
import type { PacketUnits } from './packet-snapshot.js';

/**
 * Known exceptions (issue 16 part B): the office may issue a packet with open findings only after
 * acknowledging each must-fix finding with a short reason. The packet then tells the homeowner about
 * each acknowledged finding in plain words — what it is and where — never as an instruction to the
 * installer. The engineering wording stays in the packet's Engineering notes appendix.
 */

/** The longest reason the office may give for one acknowledgement. */
export const MAX_ACKNOWLEDGEMENT_REASON_CHARS = 300;
/** The most acknowledgements one issue request may carry. */
export const MAX_ACKNOWLEDGEMENTS = 200;

/** `path` as a finding carries it, written as one string: `runs.3.depthReadings.1`. */
export const findingKey = (f: { code: string; path: readonly (string | number)[] | string }): string =>
  `${f.code}@${typeof f.path === 'string' ? f.path : f.path.join('.')}`;

export const FindingAcknowledgementSchema = z
  .object({
    code: z.string().trim().min(1, 'must not be empty').max(64, 'must be at most 64 characters'),
    /** The finding's path joined with dots, e.g. `runs.3.depthReadings.1` (empty for a whole-job finding). */
    path: z.string().max(200, 'must be at most 200 characters'),
    reason: z
      .string()
      .trim()
      .min(3, 'must give a short reason (at least 3 characters)')
      .max(MAX_ACKNOWLEDGEMENT_REASON_CHARS, `must be at most ${MAX_ACKNOWLEDGEMENT_REASON_CHARS} characters`),
  })
  .strict();
export type FindingAcknowledgementInput = z.infer<typeof FindingAcknowledgementSchema>;

/** The body of `POST /api/jobs/:jobId/packets` when one is sent (the web's issue dialog builds it). */
export const IssuePacketBodySchema = z
  .object({
    acknowledgements: z.array(FindingAcknowledgementSchema).max(MAX_ACKNOWLEDGEMENTS, `must hold at most ${MAX_ACKNOWLEDGEMENTS} entries`).optional(),
    /** The job version, when not sent as If-Match. */
    expectedVersion: z.number().int().min(1).optional(),
  })
  .strict();

/** The body of `POST /api/jobs/:jobId/packets` (optional: a job without open must-fix findings needs none). */
export const IssuePacketInputSchema = z.preprocess((v) => (v === undefined || v === null ? {} : v), IssuePacketBodySchema);
export type IssuePacketInput = z.infer<typeof IssuePacketInputSchema>;

/** An acknowledgement as frozen into the revision's snapshot. */
export interface FindingAcknowledgement {
  code: FindingCode;
  path: string;
  severity: Finding['severity'];
  reason: string;
  /** The finding's own (engineering) wording at issue, for the Engineering notes appendix. */
  message: string;
}

export type AcknowledgementProblem =
  | { kind: 'missing'; finding: Finding }
  | { kind: 'unknown'; index: number; code: string; path: string }
  | { kind: 'duplicate'; index: number; code: string; path: string };

/**
 * Matches the request's acknowledgements with the job's open findings. Every must-fix (critical) finding
 * needs one; a "check" (warning) may be acknowledged too (it then prints as a known exception); an
 * acknowledgement of no open finding, or of the same finding twice, is refused.
 */
export function matchAcknowledgements(
  findings: readonly Finding[],
  acknowledgements: readonly FindingAcknowledgementInput[],
): { problems: AcknowledgementProblem[]; accepted: FindingAcknowledgement[] } {
  // Findings sharing code and path (e.g. two channels of one amplifier) are acknowledged together.
  const open = new Map<string, Finding[]>();
  for (const f of findings) if (f.severity !== 'info') open.set(findingKey(f), [...(open.get(findingKey(f)) ?? []), f]);
  const seen = new Set<string>();
  const problems: AcknowledgementProblem[] = [];
  const accepted: FindingAcknowledgement[] = [];
  acknowledgements.forEach((a, index) => {
    const key = findingKey(a);
    const group = open.get(key);
    const finding = group?.[0];
    if (!group || !finding) problems.push({ kind: 'unknown', index, code: a.code, path: a.path });
    else if (seen.has(key)) problems.push({ kind: 'duplicate', index, code: a.code, path: a.path });
    else {
      seen.add(key);
      const severity = group.some((f) => f.severity === 'critical') ? 'critical' : finding.severity;
      accepted.push({ code: finding.code, path: a.path, severity, reason: a.reason.trim(), message: group.map((f) => f.message).join(' ') });
    }
  });
  for (const [key, group] of open) {
    const critical = group.find((f) => f.severity === 'critical');
    if (critical && !seen.has(key)) problems.push({ kind: 'missing', finding: critical });
  }
  return { problems, accepted };
}

const num = (v: unknown): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : null);

function runLabel(asBuilt: AsBuilt, finding: Pick<Finding, 'runId' | 'path'> | { path: string }): string | null {
  const path = typeof finding.path === 'string' ? finding.path.split('.') : finding.path.map(String);
  const runId = 'runId' in finding ? finding.runId : undefined;
  const run = runId ? asBuilt.runs.find((r) => r.id === runId) : path[0] === 'runs' ? asBuilt.runs[Number(path[1])] : undefined;
  return run?.label ?? null;
}

/**
 * One acknowledged finding in the homeowner's words: what it means for them and where, no instruction
 * to the installer, no jargon. `finding` is the analysed finding (with its numbers) when still present
 * in the snapshot's analysis.
 */
export function homeownerException(
  ack: FindingAcknowledgement,
  finding: Finding | undefined,
  asBuilt: AsBuilt,
  units: PacketUnits,
): string {
  const run = runLabel(asBuilt, finding ?? { path: ack.path });
  const onRun = run ? ` (the cable “${run}”)` : '';
  const data = finding?.data ?? {};
  switch (ack.code) {
    case 'DEPTH_SHALLOW': {
      const depth = num(data.depthM);
      const rule = num(data.minCoverM);
      const station = num(data.stationM);
      const where = station !== null ? ` about ${formatGroundLength(station, units)} from where it starts` : '';
      const figures = depth !== null && rule !== null ? `: ${formatDepthLength(depth, units)} of cover where our standard is ${formatRuleDepth(rule, units)}` : '';
      return `One cable${onRun} runs shallower than our standard${where}${figures}. The spot is marked on the site plan; dig there by hand only.`;
    }
    case 'LOAD_BELOW_AMP_MINIMUM':
    case 'CABLE_LOSS_OVER_LIMIT':
    case 'CV_TAPS_OVER_HEADROOM':
    case 'CV_OVERLOAD':
      return 'One amplifier channel is asked for more than its maker rates it for. It worked at handover; if it shuts off or the sound distorts at high volume, turn it down and call us.';
    case 'DEPTH_NOT_RECORDED':
      return `The depth of one buried cable${onRun} was not measured. Treat it as shallow: dig by hand anywhere near its route on the site plan.`;
    case 'DEPTH_NO_RULE':
    case 'DEPTH_RULE_OVER_30V':
      return `One buried cable${onRun} was laid where our usual depth rule does not apply. Dig by hand anywhere near its route on the site plan.`;
    case 'POSITION_FROM_TIES_FAILED':
    case 'POSITION_WEAK_GEOMETRY':
    case 'POSITION_TIES_DISAGREE':
    case 'POSITION_SIDE_HINT_MISSING':
    case 'POSITION_UNKNOWN':
    case 'ROUTE_LENGTH_MISMATCH':
      return `The position of one item or cable${onRun} on the site plan is less certain than usual. Allow extra room and dig by hand around it.`;
    case 'CHECK_READING_LOW':
    case 'CHECK_READING_HIGH':
    case 'CHECK_NOT_COMPARABLE':
    case 'CHECK_POLARITY':
    case 'CHECK_INSULATION':
    case 'CHECK_SHORT':
    case 'CHECK_OPEN':
      return 'One of the electrical tests made at handover did not match what we expected. The system was handed over working; if sound drops out or distorts, call us.';
    default:
      return `One part of the system${onRun} does not meet our usual standard. We have recorded it; if anything seems wrong with the sound, call us.`;
  }
}
