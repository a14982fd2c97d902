// Public surface of the sites feature: other features import only from here (eslint.config.js checks it).
// Sites: queries, site writes and the conflict hook.
export { getSiteQueryOptions, type SiteResponse } from './api/get-site';
export { useSites } from './api/get-sites';
export { siteKeys } from './api/site-keys';
export { useCreateReferencePoint } from './api/create-reference-point';
export { useUpdateReferencePoint } from './api/update-reference-point';
export { ReferencePointForm } from './components/reference-points';
export { useCreateSiteFeature } from './api/create-site-feature';
export { useDeleteSiteFeature } from './api/delete-site-feature';
export { useUpdateSiteFeature } from './api/update-site-feature';
export { applySiteVersions, sendSiteWrite, siteIfMatch, siteVersionOf, type SiteVersionResponse } from './api/site-write';
export { useSiteConflict } from './hooks/use-site-conflict';
