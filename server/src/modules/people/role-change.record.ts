import { roleCombinationRefusal } from '@shared/auth/role-changes';
import { roleLabels, type Role } from '@shared/auth/roles';
import type { SignableRecordType } from '../signatures/signable-records';
import { appendLedgerEvent } from '../ledger/ledger.repository';
import * as people from './people.repository';
import {
  administratorsMayApprove,
  decideRoleChangeRequest,
  findRoleChangeRequest,
} from './role-change-requests.repository';

const labels = (roles: readonly Role[]) => (roles.length ? roles.map((role) => roleLabels[role]) : ['no roles']);

/**
 * A change that grants or removes a signing role, as a second administrator confirms (or refuses)
 * it with an electronic signature. Neither the administrator who asked nor the person concerned
 * may confirm it; the roles take effect in the signature's transaction.
 */
export const roleChangeRecordType: SignableRecordType<{ status: string; stale: boolean; combination: string | null }> =
  {
    type: 'role-change',
    label: 'role change',
    action: 'people.manage',
    readAction: 'people.read',
    meanings: ['confirmed', 'refused'],
    async load(manager, recordId) {
      if (!/^\d{1,10}$/.test(recordId)) return null;
      const request = await findRoleChangeRequest(manager, Number(recordId));
      if (!request) return null;
      const person = await people.findPersonById(manager, request.personId);
      return {
        title: `Role change for ${request.personName}`,
        content: {
          person: request.personName,
          rolesBefore: labels(request.rolesBefore),
          rolesAfter: labels(request.rolesAfter),
          reason: request.reason,
          requestedBy: request.requestedBy,
          requestedAt: request.requestedAt,
        },
        authorIds: [request.requestedById, request.personId],
        status: request.status,
        stale: person ? person.roles.join() !== [...request.rolesBefore].sort().join() : true,
        combination: roleCombinationRefusal(request.rolesAfter, await administratorsMayApprove(manager)),
      };
    },
    refusal({ meaning, record }) {
      const facts = record;
      if (facts.status !== 'pending') return `This role change was already ${facts.status}`;
      if (meaning !== 'confirmed') return null;
      if (facts.stale) return 'The person’s roles changed since this was asked; refuse it and ask again';
      return facts.combination;
    },
    async afterSign(manager, { recordId, meaning, signer, reason, origin: requestOrigin }) {
      const request = (await findRoleChangeRequest(manager, Number(recordId), true))!;
      const origin = requestOrigin ?? { requestId: `signature-${recordId}`, clientAddress: null };
      const actor = { id: signer.id, name: signer.name, role: signer.role };
      if (meaning === 'confirmed') {
        const person = (await people.findPersonById(manager, request.personId, true))!;
        await people.setAdministratorRoles(manager, request.personId, request.rolesAfter, person.identityProviderRoles);
        const after = (await people.findPersonById(manager, request.personId))!;
        await decideRoleChangeRequest(manager, request.id, 'confirmed', signer.id);
        await appendLedgerEvent(manager, {
          actor,
          action: 'person.roles-changed',
          entity: { type: 'person', id: request.personId },
          before: { roles: person.roles },
          after: { roles: after.roles, request: request.id, requestedBy: request.requestedBy },
          reason: request.reason,
          origin,
        });
      } else {
        await decideRoleChangeRequest(manager, request.id, 'refused', signer.id);
        await appendLedgerEvent(manager, {
          actor,
          action: 'person.role-change-refused',
          entity: { type: 'person', id: request.personId },
          after: { request: request.id },
          reason,
          origin,
        });
      }
    },
  };
