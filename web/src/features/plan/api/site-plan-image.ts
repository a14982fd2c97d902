import type { PlanImageResponse, SiteResponse } from '@domain/sites/site.schema';

/** The site-plan image as the site answer describes it: stored size (the calibration's pixel space) and address. */
export type SitePlanImage = PlanImageResponse;

/** The plan image of `site`, or null when it has none. */
export function planImageOf(site: SiteResponse): SitePlanImage | null {
  return site.planImage ?? null;
}
