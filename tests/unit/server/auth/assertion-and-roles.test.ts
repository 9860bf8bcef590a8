import { describe, expect, it } from 'vitest';
import { assertionRefusal, readAssertionFacts } from '../../../../server/src/modules/auth/assertion-facts';
import {
  attributeValues,
  effectiveRoles,
  rolesFromGroups,
  unknownRolesInMap,
} from '../../../../server/src/modules/people/people.domain';
import { responseXml } from '../../../../scripts/stand-in-idp/saml-response';

const input = {
  issuer: 'http://idp/metadata',
  destination: 'http://app/auth/saml/acs',
  audience: 'urn:ingotrace:service-provider',
  inResponseTo: '_req1',
  subject: 'kiw-1',
  attributes: { groups: ['a', 'b'] },
  authnInstant: new Date('2026-12-01T10:00:00Z'),
  issueInstant: new Date('2026-12-01T10:00:01Z'),
  assertionId: '_assertion1',
  privateKeyPem: '',
  certificatePem: '',
};

describe('assertion facts', () => {
  it('when reading a response, then issuer, destination, recipient, id and instants come out', () => {
    const facts = readAssertionFacts(responseXml(input));
    expect(facts).toEqual({
      responseIssuer: 'http://idp/metadata',
      destination: 'http://app/auth/saml/acs',
      inResponseTo: '_req1',
      assertionId: '_assertion1',
      assertionIssuer: 'http://idp/metadata',
      recipients: ['http://app/auth/saml/acs'],
      authnInstant: new Date('2026-12-01T10:00:00Z'),
      notOnOrAfter: new Date('2026-12-01T10:05:01Z'),
    });
    expect(
      assertionRefusal(facts, { idpEntityId: 'http://idp/metadata', acsUrl: 'http://app/auth/saml/acs' }),
    ).toBeNull();
  });

  it('when the recipient differs from the destination, then the recipient is refused', () => {
    const facts = readAssertionFacts(responseXml({ ...input, recipient: 'http://elsewhere/acs' }));
    expect(assertionRefusal(facts, { idpEntityId: 'http://idp/metadata', acsUrl: 'http://app/auth/saml/acs' })).toBe(
      "Assertion recipient http://elsewhere/acs is not this service's address",
    );
  });
});

describe('roles from the identity provider', () => {
  const map = { 'qa-team': 'qa-reviewer', approvers: 'qa-approver', typo: 'qa-reveiwer' };
  it('when attribute values arrive single or several, then they become a list', () => {
    expect(attributeValues('x')).toEqual(['x']);
    expect(attributeValues(['x', ' y ', ''])).toEqual(['x', 'y']);
    expect(attributeValues(undefined)).toEqual([]);
  });
  it('when groups are mapped, then unknown groups and unknown role names are ignored', () => {
    expect(rolesFromGroups(['approvers', 'qa-team', 'canteen', 'typo'], map)).toEqual(['qa-approver', 'qa-reviewer']);
    expect(unknownRolesInMap(map)).toEqual(['qa-reveiwer']);
  });
  it(
    'when an administrator withdrew a role, then it is not effective even though the identity provider grants ' + 'it',
    () => {
      expect(
        effectiveRoles(
          [
            { role: 'qa-reviewer', source: 'identity-provider' },
            { role: 'auditor', source: 'administrator' },
          ],
          ['qa-reviewer'],
        ),
      ).toEqual(['auditor']);
    },
  );
});
