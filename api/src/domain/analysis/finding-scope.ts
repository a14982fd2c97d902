import type { AsBuilt } from '../as-built/as-built.schema.js';
import { type DateStyle, formatDate } from '../format/date-time.js';
import type { SiteRecordInfo } from '../jobs/job.schema.js';
import type { Finding } from './finding.js';

/*
 * Issue 21: the analysis runs over the site's whole system, so a finding may be about this job's work,
 * about records an earlier job left in the ground, or both (a new speaker on an old channel). The job
 * page says which, and names the job that installed the earlier records and when.
 */

/** An earlier job's records a finding is about, grouped by that job. */
export interface EarlierRecords {
  jobId: string;
  jobTitle: string;
  /** ISO date the job put them in. */
  installedOn: string;
  labels: string[];
}

export interface FindingScope {
  /** The finding is (also) about records this job added. */
  hasThisJob: boolean;
  /** Records already in the ground it is about, by installing job, oldest first. */
  earlier: EarlierRecords[];
}

/**
 * The records a finding is about: its run, its item, the record its path points into, and for a
 * channel finding the amplifier, every run carrying that channel and the items at their ends.
 */
function recordIdsOf(finding: Finding, asBuilt: AsBuilt): string[] {
  const ids: string[] = [];
  const add = (id: string | undefined) => {
    if (id !== undefined && !ids.includes(id)) ids.push(id);
  };
  add(finding.runId);
  add(finding.itemId);
  const [section, index] = finding.path;
  if (typeof index === 'number') {
    if (section === 'runs') add(asBuilt.runs[index]?.id);
    if (section === 'items') add(asBuilt.items[index]?.id);
  }
  const channel = finding.channel;
  if (channel) {
    add(channel.amplifierItemId);
    for (const run of asBuilt.runs) {
      if (!run.pairs.some((p) => p.channel?.amplifierItemId === channel.amplifierItemId && p.channel.channelId === channel.channelId)) continue;
      add(run.id);
      add(run.fromItemId);
      add(run.toItemId);
    }
  }
  return ids;
}

/**
 * Whose records a finding is about: this job's, earlier jobs' (grouped by job, with their install
 * date), or both. Null when the job has no provenance for any of them (a finding about the job as a
 * whole, or a record set without site records).
 */
export function findingScope(finding: Finding, asBuilt: AsBuilt, siteRecords: Readonly<Record<string, SiteRecordInfo>> | undefined): FindingScope | null {
  if (!siteRecords) return null;
  const labels = new Map<string, string>([...asBuilt.items, ...asBuilt.runs].map((r) => [r.id, r.label]));
  let hasThisJob = false;
  let isKnown = false;
  const earlier = new Map<string, EarlierRecords>();
  for (const id of recordIdsOf(finding, asBuilt)) {
    const info = siteRecords[id];
    if (!info) continue;
    isKnown = true;
    if (info.isThisJob) {
      hasThisJob = true;
      continue;
    }
    const group = earlier.get(info.installedBy.jobId) ?? { jobId: info.installedBy.jobId, jobTitle: info.installedBy.jobTitle, installedOn: info.installedOn, labels: [] };
    group.labels.push(labels.get(id) ?? id);
    if (info.installedOn < group.installedOn) group.installedOn = info.installedOn;
    earlier.set(group.jobId, group);
  }
  if (!isKnown) return null;
  return { hasThisJob, earlier: [...earlier.values()].sort((a, b) => (a.installedOn < b.installedOn ? -1 : a.installedOn > b.installedOn ? 1 : 0)) };
}

/** The scope in one line: "This job’s work.", or which records already in the ground, by whom and when. */
export function findingScopeText(scope: FindingScope, style: DateStyle = {}): string {
  if (scope.earlier.length === 0) return 'About this job’s work.';
  const groups = scope.earlier
    .map((g) => `${g.labels.map((l) => `“${l}”`).join(', ')} (installed ${formatDate(g.installedOn, style)} by “${g.jobTitle}”)`)
    .join('; ');
  return `${scope.hasThisJob ? 'About this job’s work and records already in the ground' : 'About records already in the ground'}: ${groups}.`;
}
