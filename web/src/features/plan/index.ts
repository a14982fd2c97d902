// Public surface of the plan feature: other features import only from here (eslint.config.js checks it).
// The plan image's bytes by address (one cache entry per image, shared with the drawings view).
export { getPlanImageQueryOptions } from './api/get-plan-image';
