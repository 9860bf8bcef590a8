import type { Role } from './roles';

/**
 * Every action the API guards. A route names exactly one action (or is public / needs only a
 * signed-in person); the server checks it on every request, the client only hides what the
 * server would refuse.
 */
export const actions = [
  'system.read',
  'materials.read',
  'materials.write',
  'materials.disposition',
  'materials.justify',
  'suppliers.manage',
  'specifications.draft',
  'specifications.approve',
  'lots.read',
  'lots.write',
  'parts.manage',
  'methods.validate',
  'heat-mixing.approve',
  'nonconformances.raise',
  'nonconformances.disposition',
  'shipments.write',
  'release.read',
  'release.submit',
  'release.review',
  'release.approve',
  'release.reject',
  'labels.print',
  'trace.read',
  'recall.read',
  'recall.manage',
  'recall.close',
  'recall.notify',
  'holds.lift',
  'audit.read',
  'people.read',
  'people.manage',
] as const;

export type Action = (typeof actions)[number];

/** Role → the actions it may perform. The one permission matrix, used by server and client. */
export const permissionMatrix: Record<Role, readonly Action[]> = {
  'manufacturing-engineer': [
    'system.read',
    'materials.read',
    'materials.write',
    'lots.read',
    'lots.write',
    'parts.manage',
    'nonconformances.raise',
    'shipments.write',
    'release.read',
    'release.submit',
    'labels.print',
    'trace.read',
  ],
  'qa-reviewer': [
    'system.read',
    'materials.read',
    'materials.disposition',
    'specifications.draft',
    'lots.read',
    'nonconformances.raise',
    'release.read',
    'release.review',
    'release.reject',
    'trace.read',
    'recall.read',
    'audit.read',
  ],
  'qa-approver': [
    'system.read',
    'materials.read',
    'materials.justify',
    'suppliers.manage',
    'specifications.draft',
    'specifications.approve',
    'methods.validate',
    'lots.read',
    'heat-mixing.approve',
    'nonconformances.raise',
    'nonconformances.disposition',
    'release.read',
    'release.approve',
    'release.reject',
    'trace.read',
    'recall.read',
    'recall.close',
    'holds.lift',
    'audit.read',
  ],
  // Read-only over everything.
  auditor: [
    'system.read',
    'materials.read',
    'lots.read',
    'release.read',
    'trace.read',
    'recall.read',
    'audit.read',
    'people.read',
  ],
  'recall-coordinator': [
    'system.read',
    'materials.read',
    'lots.read',
    'release.read',
    'trace.read',
    'recall.read',
    'recall.manage',
    'recall.close',
    'recall.notify',
  ],
  // Administers people and configuration; signs nothing and edits no quality record.
  administrator: ['system.read', 'people.read', 'people.manage'],
};

export function rolesAllow(personRoles: readonly Role[], action: Action): boolean {
  return personRoles.some((role) => permissionMatrix[role].includes(action));
}

export function allowedActions(personRoles: readonly Role[]): Action[] {
  return actions.filter((action) => rolesAllow(personRoles, action));
}

/** The role under which a person performs an action (the first of their roles that allows it). */
export function actingRole(personRoles: readonly Role[], action: Action): Role | null {
  return personRoles.find((role) => permissionMatrix[role].includes(action)) ?? null;
}
