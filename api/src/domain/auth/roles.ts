/** The five roles of PRODUCT.md. Staff roles work for the company; a homeowner sees only their own sites. */
export const ROLES = ['admin', 'office', 'lead', 'tech', 'homeowner'] as const;
export type Role = (typeof ROLES)[number];

export const STAFF_ROLES = ['admin', 'office', 'lead', 'tech'] as const satisfies readonly Role[];

export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Admin',
  office: 'Office',
  lead: 'Crew lead',
  tech: 'Technician',
  homeowner: 'Homeowner',
};

export function isStaffRole(role: Role): boolean {
  return (STAFF_ROLES as readonly Role[]).includes(role);
}

/**
 * Who may invite whom: an admin invites anyone; office invites staff below admin and homeowners;
 * crew leads, technicians and homeowners invite nobody.
 */
export function canInvite(actor: Role, invitee: Role): boolean {
  if (actor === 'admin') return true;
  if (actor === 'office') return invitee !== 'admin';
  return false;
}

/** Only admins manage users (roles, disabling); nobody changes or disables their own account here. */
export function canManageUser(actor: Role, actorId: string, targetId: string): boolean {
  return actor === 'admin' && actorId !== targetId;
}
