import { roleSchema, type Role } from '@shared/auth/roles';

/** Attribute values arrive as a string when single and as an array when several. */
export function attributeValues(value: unknown): string[] {
  if (value === undefined || value === null) return [];
  const values = Array.isArray(value) ? value : [value];
  return values
    .filter((item): item is string => typeof item === 'string')
    .map((item) => item.trim())
    .filter(Boolean);
}

/** Maps identity-provider groups to Ingotrace roles; unknown groups are ignored. */
export function rolesFromGroups(groups: string[], roleMap: Record<string, string>): Role[] {
  const mapped = new Set<Role>();
  for (const group of groups) {
    const role = roleSchema.safeParse(roleMap[group]);
    if (role.success) mapped.add(role.data);
  }
  return [...mapped].sort();
}

/** Checks a configured group→role map; returns the names that are not roles. */
export function unknownRolesInMap(roleMap: Record<string, string>): string[] {
  return Object.values(roleMap).filter((role) => !roleSchema.safeParse(role).success);
}

export interface RoleGrant {
  role: Role;
  source: 'identity-provider' | 'administrator';
}

/** Effective roles: what the identity provider and administrators granted, less what administrators withdrew. */
export function effectiveRoles(grants: RoleGrant[], withdrawn: Role[]): Role[] {
  const result = new Set<Role>();
  for (const grant of grants) if (!withdrawn.includes(grant.role)) result.add(grant.role);
  return [...result].sort();
}
