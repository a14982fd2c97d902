// Public surface of the sites feature: other features import only from here (eslint.config.js checks it).
// Sites: queries, site writes and the conflict hook.
export { getSiteQueryOptions, type SiteResponse } from './api/get-site';
export { useSites } from './api/get-sites';
export { siteKeys } from './api/site-keys';
export { useSaveReferencePoint } from './api/save-reference-point';
export { ReferencePointForm } from './components/reference-points';
export { useWriteSiteFeature } from './api/save-site-feature';
export { applySiteVersions, sendSiteWrite, siteIfMatch, siteVersionOf, type SiteVersionResponse } from './api/site-write';
export { useSiteConflict } from './hooks/use-site-conflict';
