// Public surface of the jobs feature: other features import only from here (eslint.config.js checks it).
// Jobs: the list, the status badge, the record writer and the pieces the plan editor reuses.
export { getJobsQueryOptions, useJobs, type JobListParams } from './api/get-jobs';
export { JobStatusBadge } from './components/job-status-badge';
export { LengthInput } from './components/length-input';
export { SaveStateBar } from './components/save-state-bar';
export { TiesEditor, type TieDraft } from './components/ties-editor';
export { useJobWriter } from './hooks/job-writer';
export { jobPermissions } from './utils/job-permissions';
export { requestPhoneFix, type GpsFix } from './utils/phone-fix';
