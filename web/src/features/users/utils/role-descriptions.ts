import type { Role } from '@domain/auth/roles';

/** One line per role, for choosing a role when inviting or changing someone's role. */
export const ROLE_DESCRIPTIONS: Record<Role, string> = {
  admin: 'Everything, including people, roles and company settings.',
  office: 'Customers, sites and jobs; reviews as-builts and sends packets.',
  lead: 'Records the as-built on site and submits it.',
  tech: "Adds photos, depths and checks on the crew's jobs.",
  homeowner: "Sees their own property's packets and cable map.",
};
