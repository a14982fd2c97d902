// Public surface of the users feature: other features import only from here (eslint.config.js checks it).
// Users and invitations.
export { getInvitationsQueryOptions } from './api/get-invitations';
export { getUsersQueryOptions } from './api/get-users';
