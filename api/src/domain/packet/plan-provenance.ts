import { type DateStyle, formatDate } from '../format/date-time.js';
import type { SiteRecordInfo } from '../jobs/job.schema.js';

/*
 * Issue 21: the packet's plan shows, per run, when it went in and by which job, and for an abandoned
 * run since when — so 2026 cable can be told from later cable on paper as on the locate map.
 */

/**
 * The provenance lines under each run's label on the packet's site plan, by run id: "In since <date>,
 * <job>" and, for a run abandoned in place, "Abandoned since <date>, <job>". Dates in the company's
 * zone and locale. Only runs the snapshot has provenance for (a revision issued before the site
 * record has none, and its plan prints as it did).
 */
export function runProvenanceLines(siteRecords: Readonly<Record<string, SiteRecordInfo>> | undefined, style: DateStyle): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const [id, info] of Object.entries(siteRecords ?? {})) {
    if (info.kind !== 'run') continue;
    const lines = [`In since ${formatDate(info.installedOn, style)}, ${info.installedBy.jobTitle}`];
    if (info.abandoned) lines.push(`Abandoned since ${formatDate(info.abandoned.on, style)}, ${info.abandoned.jobTitle}`);
    out[id] = lines;
  }
  return out;
}
