import type { EntityManager } from 'typeorm';
import type { Role } from '@shared/auth/roles';
import type { Person, PeopleQuery } from '@shared/schemas/people';
import { effectiveRoles, type RoleGrant } from './people.domain';

interface PersonRow {
  id: number;
  subject: string;
  name: string;
  email: string;
  active: number;
  last_sign_in_at: Date | null;
}

async function rolesFor(
  manager: EntityManager,
  personIds: number[],
): Promise<Map<number, { grants: RoleGrant[]; withdrawn: Role[] }>> {
  const result = new Map<number, { grants: RoleGrant[]; withdrawn: Role[] }>();
  for (const id of personIds) result.set(id, { grants: [], withdrawn: [] });
  if (personIds.length === 0) return result;
  const grants: Array<{ person_id: number; role: Role; source: RoleGrant['source'] }> = await manager.query(
    'SELECT person_id, role, source FROM person_role WHERE person_id IN (?)',
    [personIds],
  );
  const withdrawals: Array<{ person_id: number; role: Role }> = await manager.query(
    'SELECT person_id, role FROM person_role_withdrawal WHERE person_id IN (?)',
    [personIds],
  );
  for (const grant of grants) result.get(grant.person_id)?.grants.push({ role: grant.role, source: grant.source });
  for (const withdrawal of withdrawals) result.get(withdrawal.person_id)?.withdrawn.push(withdrawal.role);
  return result;
}

function toPerson(row: PersonRow, roles: { grants: RoleGrant[]; withdrawn: Role[] }): Person {
  return {
    id: row.id,
    subject: row.subject,
    name: row.name,
    email: row.email,
    active: Boolean(row.active),
    roles: effectiveRoles(roles.grants, roles.withdrawn),
    identityProviderRoles: roles.grants
      .filter((grant) => grant.source === 'identity-provider')
      .map((grant) => grant.role)
      .sort(),
    lastSignInAt: row.last_sign_in_at ? new Date(row.last_sign_in_at).toISOString() : null,
  };
}

const personColumns = 'id, subject, name, email, active, last_sign_in_at';

/** Columns of a person (table alias p) with their role grants and withdrawals, for one round trip. */
export const personWithRolesColumns = `p.id, p.subject, p.name, p.email, p.active, p.last_sign_in_at,
  (SELECT GROUP_CONCAT(CONCAT(r.role, ' ', r.source)) FROM person_role r WHERE r.person_id = p.id) AS grants,
  (SELECT GROUP_CONCAT(w.role) FROM person_role_withdrawal w WHERE w.person_id = p.id) AS withdrawn`;

export type PersonWithRolesRow = PersonRow & { grants: string | null; withdrawn: string | null };

/** A person read with personWithRolesColumns. */
export function personFromRow(row: PersonWithRolesRow): Person {
  const grants = (row.grants ? row.grants.split(',') : []).map((entry) => {
    const [role, source] = entry.split(' ') as [Role, RoleGrant['source']];
    return { role, source };
  });
  return toPerson(row, { grants, withdrawn: (row.withdrawn ? row.withdrawn.split(',') : []) as Role[] });
}

/** One person with their role grants and withdrawals in one round trip. */
export async function findPersonById(manager: EntityManager, id: number, lock = false): Promise<Person | null> {
  const [row]: PersonWithRolesRow[] = await manager.query(
    `SELECT ${personWithRolesColumns} FROM person p WHERE p.id = ?${lock ? ' FOR UPDATE' : ''}`,
    [id],
  );
  return row ? personFromRow(row) : null;
}

export async function findPersonBySubject(manager: EntityManager, subject: string): Promise<Person | null> {
  const [row]: PersonRow[] = await manager.query(`SELECT ${personColumns} FROM person WHERE subject = ? FOR UPDATE`, [
    subject,
  ]);
  if (!row) return null;
  return toPerson(row, (await rolesFor(manager, [row.id])).get(row.id)!);
}

export async function insertPerson(
  manager: EntityManager,
  person: { subject: string; name: string; email: string; active?: boolean },
): Promise<number> {
  const result: { insertId: number } = await manager.query(
    'INSERT INTO person (subject, name, email, active) VALUES (?, ?, ?, ?)',
    [person.subject, person.name, person.email, person.active === false ? 0 : 1],
  );
  return result.insertId;
}

export async function updatePersonProfile(
  manager: EntityManager,
  id: number,
  profile: { name: string; email: string; signedInAt: Date },
): Promise<void> {
  await manager.query('UPDATE person SET name = ?, email = ?, last_sign_in_at = ? WHERE id = ?', [
    profile.name,
    profile.email,
    profile.signedInAt,
    id,
  ]);
}

export async function setPersonActive(manager: EntityManager, id: number, active: boolean): Promise<void> {
  await manager.query('UPDATE person SET active = ? WHERE id = ?', [active ? 1 : 0, id]);
}

export async function replaceIdentityProviderRoles(
  manager: EntityManager,
  personId: number,
  roles: Role[],
): Promise<void> {
  await manager.query("DELETE FROM person_role WHERE person_id = ? AND source = 'identity-provider'", [personId]);
  for (const role of roles)
    await manager.query("INSERT INTO person_role (person_id, role, source) VALUES (?, ?, 'identity-provider')", [
      personId,
      role,
    ]);
}

/**
 * Makes the administrator's choice of roles effective: grants what the IdP does not give, withdraws what it gives but
 * should not.
 */
export async function setAdministratorRoles(
  manager: EntityManager,
  personId: number,
  wanted: Role[],
  identityProviderRoles: Role[],
): Promise<void> {
  await manager.query("DELETE FROM person_role WHERE person_id = ? AND source = 'administrator'", [personId]);
  await manager.query('DELETE FROM person_role_withdrawal WHERE person_id = ?', [personId]);
  for (const role of wanted.filter((role) => !identityProviderRoles.includes(role))) {
    await manager.query("INSERT INTO person_role (person_id, role, source) VALUES (?, ?, 'administrator')", [
      personId,
      role,
    ]);
  }
  for (const role of identityProviderRoles.filter((role) => !wanted.includes(role))) {
    await manager.query('INSERT INTO person_role_withdrawal (person_id, role) VALUES (?, ?)', [personId, role]);
  }
}

export async function listPeople(
  manager: EntityManager,
  query: PeopleQuery,
): Promise<{ items: Person[]; total: number }> {
  const where: string[] = [];
  const parameters: unknown[] = [];
  if (query.search) {
    where.push('(name LIKE ? OR email LIKE ? OR subject LIKE ?)');
    const pattern = `%${query.search.replace(/[\\%_]/g, (character) => `\\${character}`)}%`;
    parameters.push(pattern, pattern, pattern);
  }
  if (query.status !== 'all') where.push(`active = ${query.status === 'active' ? 1 : 0}`);
  const clause = where.length ? `WHERE ${where.join(' AND ')}` : '';
  const [count]: Array<{ total: string }> = await manager.query(
    `SELECT COUNT(*) AS total FROM person ${clause}`,
    parameters,
  );
  const rows: PersonRow[] = await manager.query(
    `SELECT ${personColumns} FROM person ${clause} ORDER BY name, id LIMIT ? OFFSET ?`,
    [...parameters, query.pageSize, (query.page - 1) * query.pageSize],
  );
  const roles = await rolesFor(
    manager,
    rows.map((row) => row.id),
  );
  return { items: rows.map((row) => toPerson(row, roles.get(row.id)!)), total: Number(count?.total ?? 0) };
}
