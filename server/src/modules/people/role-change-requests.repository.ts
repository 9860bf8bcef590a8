import type { EntityManager } from 'typeorm';
import type { Role } from '@shared/auth/roles';
import type { RoleChangeRequest } from '@shared/schemas/people';

interface RequestRow {
  id: number;
  person_id: number;
  person_name: string;
  roles_before: string;
  roles_after: string;
  reason: string;
  requested_by: number;
  requested_by_name: string;
  requested_at: Date;
  status: 'pending' | 'confirmed' | 'refused';
}

const select = `
  SELECT r.*, p.name AS person_name, q.name AS requested_by_name
  FROM role_change_request r JOIN person p ON p.id = r.person_id JOIN person q ON q.id = r.requested_by`;

const toRequest = (row: RequestRow): RoleChangeRequest & { status: RequestRow['status'] } => ({
  id: Number(row.id),
  personId: Number(row.person_id),
  personName: row.person_name,
  rolesBefore: JSON.parse(row.roles_before) as Role[],
  rolesAfter: JSON.parse(row.roles_after) as Role[],
  reason: row.reason,
  requestedBy: row.requested_by_name,
  requestedById: Number(row.requested_by),
  requestedAt: new Date(row.requested_at).toISOString(),
  status: row.status,
});

export async function insertRoleChangeRequest(
  manager: EntityManager,
  request: { personId: number; rolesBefore: Role[]; rolesAfter: Role[]; reason: string; requestedBy: number },
): Promise<number> {
  const result: { insertId: number } = await manager.query(
    'INSERT INTO role_change_request (person_id, roles_before, roles_after, reason, requested_by) VALUES (?, ' +
      '?, ?, ?, ?)',
    [
      request.personId,
      JSON.stringify(request.rolesBefore),
      JSON.stringify(request.rolesAfter),
      request.reason,
      request.requestedBy,
    ],
  );
  return Number(result.insertId);
}

export async function findRoleChangeRequest(manager: EntityManager, id: number, lock = false) {
  const [row]: RequestRow[] = await manager.query(`${select} WHERE r.id = ?${lock ? ' FOR UPDATE' : ''}`, [id]);
  return row ? toRequest(row) : null;
}

export async function pendingRoleChanges(manager: EntityManager, personId?: number): Promise<RoleChangeRequest[]> {
  const rows: RequestRow[] = await manager.query(
    `${select} WHERE r.status = 'pending'${personId ? ' AND r.person_id = ?' : ''} ORDER BY r.requested_at, r.id`,
    personId ? [personId] : [],
  );
  return rows.map((row) => {
    const { status: _status, ...request } = toRequest(row);
    return request;
  });
}

export async function decideRoleChangeRequest(
  manager: EntityManager,
  id: number,
  status: 'confirmed' | 'refused',
  decidedBy: number,
): Promise<void> {
  await manager.query(
    'UPDATE role_change_request SET status = ?, decided_by = ?, decided_at = CURRENT_TIMESTAMP(6) WHERE id = ' +
      "? AND status = 'pending'",
    [status, decidedBy, id],
  );
}

export async function administratorsMayApprove(manager: EntityManager): Promise<boolean> {
  const [row]: Array<{ administrators_may_approve: number }> = await manager.query(
    'SELECT administrators_may_approve FROM organisation ORDER BY id LIMIT 1',
  );
  return Boolean(row?.administrators_may_approve);
}

export async function setAdministratorsMayApprove(manager: EntityManager, allowed: boolean): Promise<void> {
  await manager.query('UPDATE organisation SET administrators_may_approve = ?', [allowed ? 1 : 0]);
}

/** Names of people who hold Administrator and QA approver together (granted and not withdrawn). */
export async function peopleHoldingBoth(manager: EntityManager): Promise<string[]> {
  const rows: Array<{ name: string }> = await manager.query(
    `SELECT p.name FROM person p
      WHERE (SELECT COUNT(DISTINCT r.role) FROM person_role r WHERE r.person_id = p.id AND r.role IN
        ('administrator', 'qa-approver')
              AND NOT EXISTS (SELECT 1 FROM person_role_withdrawal w WHERE w.person_id = p.id AND w.role = r.role)) = 2
      ORDER BY p.name`,
  );
  return rows.map((row) => row.name);
}
