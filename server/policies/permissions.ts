/**
 * Roles and what each may do — the one place that decides it. The server's lab guard
 * enforces it on every lab route; the client receives the signed-in member's permission
 * list (GET /api/v1/labs/:lab) and hides what the role cannot do.
 *
 * Pure data, no imports: the client may import it too.
 */
export const ROLES = ['admin', 'technician', 'scientist', 'guest'] as const;
export type Role = (typeof ROLES)[number];

export const PERMISSIONS = [
  'lab.read',
  'lab.manage',
  'members.read',
  'members.manage',
  'invitations.manage',
  'audit.read',
  'loggers.read',
  'loggers.manage',
  'ingest-keys.manage',
  'uploads.create',
  'quarantine.review',
  'channels.read',
  'diagnostics.read',
  'exports.create',
  'tokens.manage-own',
  'billing.manage',
  'alerts.read',
  'alerts.subscribe',
  'alerts.manage',
] as const;
export type Permission = (typeof PERMISSIONS)[number];

const READ: Permission[] = ['lab.read', 'loggers.read', 'channels.read', 'diagnostics.read', 'alerts.read'];

/** The product brief's role table (admin, technician, scientist, guest), as permissions. */
export const ROLE_PERMISSIONS: Record<Role, readonly Permission[]> = {
  admin: PERMISSIONS,
  technician: [
    ...READ,
    'members.read',
    'loggers.manage',
    'ingest-keys.manage',
    'uploads.create',
    'quarantine.review',
    'exports.create',
    'tokens.manage-own',
    'alerts.subscribe',
    'alerts.manage',
  ],
  scientist: [...READ, 'members.read', 'exports.create', 'tokens.manage-own', 'alerts.subscribe'],
  guest: READ,
};

/** Whether `role` may do `permission`. */
export function can(role: Role, permission: Permission): boolean {
  return ROLE_PERMISSIONS[role].includes(permission);
}

/** Labels for the roles as people read them. */
export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Admin',
  technician: 'Technician',
  scientist: 'Scientist',
  guest: 'Guest',
};
