// Public surface of the job-record feature: other features import only from here (eslint.config.js checks it).
// The job record every feature reads: the as-built query and the labels of record kinds.
export { getJobAsBuiltQueryOptions, type JobAsBuiltResponse } from './api/get-job-as-built';
export { jobKeys } from './api/job-keys';
export { ITEM_KIND_LABELS, LOCATION_LABELS, METHOD_LABELS } from './utils/record-labels';
export { gpsBends, gpsBendsText, type GpsBend } from './utils/gps-bends';
