import { z } from 'zod';

/** GET /api/portal/sites: the homeowner's sites. */
export const PortalSiteResponseSchema = z.object({
  id: z.uuid(),
  label: z.string(),
  addressLine1: z.string(),
  addressLine2: z.string().nullable(),
  city: z.string(),
  region: z.string().nullable(),
  postalCode: z.string().nullable(),
  country: z.string(),
  installer: z.object({
    companyName: z.string(),
    phone: z.string().nullable(),
    email: z.string().nullable(),
    licenceNumbers: z.array(z.string()),
  }),
  /** Ready packet revisions at the site, all jobs. */
  packetCount: z.number().int(),
  lastIssuedAt: z.string().nullable(),
});
export type PortalSiteResponse = z.infer<typeof PortalSiteResponseSchema>;

const FileSchema = z.object({ bytes: z.number().int(), sha256: z.string(), url: z.string() });

export const PortalPacketSchema = z.object({
  id: z.uuid(),
  jobId: z.uuid(),
  jobTitle: z.string(),
  revision: z.number().int(),
  issuedAt: z.string(),
  pageCount: z.number().int().nullable(),
  /** Download through the portal; compare the file's SHA-256 with `sha256` to verify it. */
  pdf: FileSchema,
  archive: FileSchema,
  /** The site's newest ready packet, of any job: the current record of the whole installed system (issue 21). */
  isLatest: z.boolean(),
});

/** GET /api/portal/sites/:siteId: the site and every ready revision of every job there, newest first. */
export const PortalSiteDetailResponseSchema = PortalSiteResponseSchema.extend({
  packets: z.array(PortalPacketSchema),
  mapUrl: z.string(),
  locateLinksUrl: z.string(),
});
export type PortalSiteDetailResponse = z.infer<typeof PortalSiteDetailResponseSchema>;
export type PortalPacket = z.infer<typeof PortalPacketSchema>;
