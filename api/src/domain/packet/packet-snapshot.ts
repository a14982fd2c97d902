import type { AsBuiltAnalysis } from '../analysis/analyze.js';
import type { AsBuilt } from '../as-built/as-built.schema.js';
import type { ChannelSetup } from '../jobs/job-record.schema.js';
import type { SiteRecordInfo } from '../jobs/job.schema.js';
import type { FindingAcknowledgement } from './known-exceptions.js';
import type { WhatChanged } from './what-changed.js';

export type PaperSize = 'letter' | 'a4';
export type PacketUnits = 'imperial' | 'metric';

/** What a company prints on its packets (company settings, with defaults letter / imperial). */
export interface PacketSettings {
  paperSize: PaperSize;
  units: PacketUnits;
  licenceNumbers: string[];
  contactPhone: string | null;
  contactEmail: string | null;
  /** Company profile fields copied at issue time (absent in revisions issued before the profile existed). */
  website?: string | null;
  postalAddress?: string | null;
  /** IANA time zone name of the company, or null when it never chose one. */
  timeZone?: string | null;
  /** BCP 47 locale for dates and numbers (default en-US). */
  locale?: string;
}

/**
 * The immutable source of one issued packet revision, frozen at issue time. Everything the packet
 * prints comes from here (plus the photos and signatures, which are attached to the revision), so a
 * revision re-renders identically however the live job changes later.
 */
export interface PacketSnapshot {
  /** Schema version of this document, for readers of old revisions. */
  format: 1;
  revision: number;
  /** ISO timestamp of the issue. */
  issuedAt: string;
  issuedBy: { id: string; name: string } | null;
  company: {
    id: string;
    name: string;
    /**
     * Storage key of the company logo at issue time (a PNG that is never overwritten), or null without a
     * logo. Absent in revisions issued before the company profile: those print no logo.
     */
    logoKey?: string | null;
  };
  settings: PacketSettings;
  job: {
    id: string;
    title: string;
    startDate: string | null;
    endDate: string | null;
    notes: string | null;
  };
  site: {
    id: string;
    label: string;
    addressLine1: string;
    addressLine2: string | null;
    city: string;
    region: string | null;
    postalCode: string | null;
    country: string;
    /**
     * The site's calibrated plan image at issue time (the storage key of its screen-size copy), drawn
     * under the site plan. Absent when the site had no image or no calibration, and in older snapshots.
     */
    planImage?: {
      screenKey: string;
      widthPx: number;
      heightPx: number;
      calibration: { a: { x: number; y: number }; b: { x: number; y: number }; distanceM: number };
    };
  };
  customer: { id: string; name: string; email: string | null; phone: string | null };
  crewLead: { id: string; name: string } | null;
  technicians: { id: string; name: string }[];
  asBuilt: AsBuilt;
  analysis: AsBuiltAnalysis;
  /** Amplifier channel setup by channel id (not part of the as-built contract). */
  channelSetups: Record<string, ChannelSetup>;
  /**
   * Open findings the office acknowledged when issuing, with its reason (every must-fix finding has one).
   * They print as Known exceptions in the homeowner's words. Absent in revisions issued before this existed.
   */
  acknowledgements?: FindingAcknowledgement[];
  /**
   * Issue 21: `asBuilt` is the site's whole installed system as this issue left it. Per record id: who
   * installed it and when, who changed or abandoned it. Absent in revisions issued before.
   */
  siteRecords?: Record<string, SiteRecordInfo>;
  /** Records this job took out of the ground (not in `asBuilt` any more), with the date. */
  removedRecords?: { kind: 'item' | 'run'; id: string; label: string; removedOn: string }[];
  /** What changed against the site's previous packet, which this one supersedes; absent for a site's first packet. */
  whatChanged?: WhatChanged;
}

/** A photo as it prints in the appendix: already resized for print and inlined. */
export interface PacketPhoto {
  caption: string;
  /** ISO timestamp (EXIF or upload time), or null when unknown. */
  takenAt: string | null;
  /** `data:image/jpeg;base64,…` (or png/webp); anything else is refused by the renderer. */
  dataUri: string;
}

/** A signature captured at the walkthrough. */
export interface PacketSignature {
  role: 'lead' | 'homeowner';
  signerName: string;
  signedAt: string;
  /** SVG path data in a 0 0 400 120 box. */
  svgPath: string;
}
