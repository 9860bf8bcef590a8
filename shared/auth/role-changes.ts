import { roleLabels, type Role } from './roles';

/** Roles whose holders sign quality records: granting or removing one needs a second administrator's confirmation. */
export const signingRoles: readonly Role[] = ['qa-reviewer', 'qa-approver', 'recall-coordinator'];

/** The signing roles a change adds or removes (empty when it touches none). */
export function signingRolesChanged(before: readonly Role[], after: readonly Role[]): Role[] {
  return signingRoles.filter((role) => before.includes(role) !== after.includes(role));
}

/**
 * Why a set of roles may not be held together, or null. An administrator who is also a QA
 * approver could shape who signs and then sign: refused unless the organisation allows it.
 */
export function roleCombinationRefusal(roles: readonly Role[], administratorsMayApprove: boolean): string | null {
  if (!administratorsMayApprove && roles.includes('administrator') && roles.includes('qa-approver')) {
    return (
      `${roleLabels.administrator} and ${roleLabels['qa-approver']} cannot be held together (organisation ` + `setting)`
    );
  }
  return null;
}

/** Why an administrator may not make this change themselves, or null. */
export function ownRoleChangeRefusal(actorId: number | null, personId: number): string | null {
  return actorId === personId ? 'Nobody changes their own roles; ask another administrator' : null;
}
