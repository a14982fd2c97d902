import { createHash } from 'node:crypto';

import { Injectable } from '@nestjs/common';

import type { DepthRuleTable } from '../domain/depth/depth-rules.schema.js';
import type { JobAsBuiltResponse } from '../domain/jobs/job.schema.js';

/** The part of an as-built answer that depends only on the job's record, its site and the rule table. */
export type AsBuiltPart = Omit<JobAsBuiltResponse, 'job'>;

export interface CachedAsBuilt {
  part: AsBuiltPart;
  /**
   * The answer's UTF-8 bytes after the job: `,"asBuilt":…,"analysis":…,"records":…}`. Kept encoded,
   * because encoding the whole answer text again on every read (names with an en dash or a ✓ make it
   * a two-byte string, UTF-8 encoded character by character) cost more than the rest of a cached read.
   */
  answerTail: Buffer;
  /** A hash of the part's JSON, for the answer's ETag. */
  partHash: string;
}

/** The as-built answer's bytes: `{"job":<jobJson>` followed by the cached part (see CachedAsBuilt.answerTail). */
export function spliceAsBuiltAnswer(jobJson: string, entry: CachedAsBuilt): Buffer {
  const head = Buffer.from(`{"job":${jobJson}`, 'utf8');
  return Buffer.concat([head, entry.answerTail], head.length + entry.answerTail.length);
}

/** Entries kept; the least recently used goes first. The demo job's part is about 100 kB of JSON. */
export const AS_BUILT_CACHE_ENTRIES = 200;

export function sha1(text: string): string {
  return createHash('sha1').update(text).digest('base64url');
}

/** The hash of a company's own depth rule table (`-` when it follows the shipped defaults). */
export function depthRulesHash(depthRules: DepthRuleTable | undefined): string {
  return depthRules === undefined ? '-' : sha1(JSON.stringify(depthRules));
}

/**
 * The computed as-built of a job (rows mapped to the contract, the analysis, the record ids) kept in
 * process under everything it is computed from: the job id and version (every write to the job's
 * record bumps it in the same transaction), the site's version (site geometry — reference points,
 * north, origin, landmarks — is shared by every job on the site and bumps only the site for a job
 * that is not open) and the company's depth rule table. A stale entry is therefore never found: any
 * change makes a new key, and old keys age out of the LRU. Safe with several API processes, since
 * the versions live in the database.
 */
@Injectable()
export class AsBuiltCache {
  private readonly entries = new Map<string, CachedAsBuilt>();
  private readonly capacity = AS_BUILT_CACHE_ENTRIES;

  static key(jobId: string, jobVersion: number, siteVersion: number | string, depthRules: DepthRuleTable | undefined): string {
    return `${jobId}:${jobVersion}:${siteVersion}:${depthRulesHash(depthRules)}`;
  }

  get(key: string): CachedAsBuilt | undefined {
    const entry = this.entries.get(key);
    if (entry) {
      // Most recently used goes to the end of the Map's order.
      this.entries.delete(key);
      this.entries.set(key, entry);
    }
    return entry;
  }

  set(key: string, part: AsBuiltPart): CachedAsBuilt {
    const partJson = JSON.stringify(part).slice(1, -1);
    const entry: CachedAsBuilt = { part, answerTail: Buffer.from(`,${partJson}}`, 'utf8'), partHash: sha1(partJson) };
    this.entries.delete(key);
    this.entries.set(key, entry);
    while (this.entries.size > this.capacity) {
      const oldest = this.entries.keys().next().value as string;
      this.entries.delete(oldest);
    }
    return entry;
  }

  get size(): number {
    return this.entries.size;
  }
}
