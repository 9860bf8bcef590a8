import { describe, expect, it } from 'vitest';
import { actingRole, allowedActions, rolesAllow } from '@shared/auth/permissions';
import { separationOfDutiesRefusal } from '@shared/auth/separation-of-duties';
import { reauthenticationRefusal } from '@shared/auth/reauthentication-rules';

describe('permissions', () => {
  it(
    'when a person holds several roles, then they may do what any of them allows, acting in the role that ' +
      'allows it',
    () => {
      expect(rolesAllow(['manufacturing-engineer'], 'people.manage')).toBe(false);
      expect(rolesAllow(['manufacturing-engineer', 'administrator'], 'people.manage')).toBe(true);
      expect(actingRole(['auditor', 'administrator'], 'people.manage')).toBe('administrator');
      expect(actingRole(['auditor'], 'people.manage')).toBeNull();
      expect(allowedActions([])).toEqual([]);
    },
  );
});

describe('separation of duties', () => {
  const history = { authorIds: [1], reviewerIds: [2] };
  it('when the author would review, then it is refused', () => {
    expect(separationOfDutiesRefusal(1, 'review', history)).toBe('You authored this record, so you cannot review it');
  });
  it('when the reviewer would approve, then it is refused', () => {
    expect(separationOfDutiesRefusal(2, 'approval', history)).toBe(
      'You reviewed this record, so someone else must approve it',
    );
  });
  it('when someone else approves, then it is allowed', () => {
    expect(separationOfDutiesRefusal(3, 'approval', history)).toBeNull();
    expect(separationOfDutiesRefusal(2, 'review', history)).toBeNull();
  });
});

describe('re-authentication rules', () => {
  const base = {
    expectedSubject: 'a',
    assertedSubject: 'a',
    startedAt: new Date('2026-12-01T10:00:00.600Z'),
    clockSkewMs: 0,
  };
  it('when the same person authenticated after the start (within the same second), then it counts', () => {
    expect(
      reauthenticationRefusal({
        ...base,
        authnInstant: new Date('2026-12-01T10:00:00Z'),
        now: new Date('2026-12-01T10:00:05Z'),
      }),
    ).toBeNull();
  });
  it('when the authentication is from before the start, then it is stale', () => {
    expect(
      reauthenticationRefusal({
        ...base,
        authnInstant: new Date('2026-12-01T09:59:59Z'),
        now: new Date('2026-12-01T10:00:05Z'),
      }),
    ).toMatch(/stale/);
  });
  it('when the authentication is older than two minutes, then it is refused', () => {
    expect(
      reauthenticationRefusal({
        ...base,
        authnInstant: new Date('2026-12-01T10:00:01Z'),
        now: new Date('2026-12-01T10:02:01.001Z'),
      }),
    ).toBe('The re-authentication is older than 2 minutes');
  });
  it('when another person authenticated, then it is refused', () => {
    expect(
      reauthenticationRefusal({
        ...base,
        assertedSubject: 'b',
        authnInstant: new Date('2026-12-01T10:00:01Z'),
        now: new Date('2026-12-01T10:00:05Z'),
      }),
    ).toMatch(/different person/);
  });
});
