import { describe, expect, it } from 'vitest';
import {
  instantFromPlantLocal,
  isTimeZone,
  plantDate,
  plantDateTime,
  plantDateTimeSeconds,
  plantLocalInput,
} from '@shared/domain/plant-time';

// Summer time in the UK begins at 01:00 GMT on the last Sunday of March and ends at 01:00 GMT on the
// last Sunday of October (The Summer Time Order 2002, SI 2002/262, as kept in the IANA tz database,
// zone Europe/London); in 2026 those Sundays are 29 March and 25 October. US Eastern time moves at
// 02:00 local on the second Sunday of March and the first Sunday of November (15 U.S.C. §260a),
// in 2026 8 March and 1 November.
describe('plant time', () => {
  it(
    'when an instant falls either side of the UK spring ' + 'change, then the plant clock jumps an hour at 01:00 UTC',
    () => {
      expect(plantDateTime('2026-03-29T00:59:00Z', 'Europe/London')).toBe('2026-03-29 00:59');
      expect(plantDateTime('2026-03-29T01:00:00Z', 'Europe/London')).toBe('2026-03-29 02:00');
      expect(plantDateTime('2026-10-25T00:59:00Z', 'Europe/London')).toBe('2026-10-25 01:59');
      expect(plantDateTime('2026-10-25T01:00:00Z', 'Europe/London')).toBe('2026-10-25 01:00');
    },
  );
  it('when the plant is on US Eastern time, then the day can differ from the UTC day', () => {
    expect(plantDate('2026-03-08T06:59:00Z', 'America/New_York')).toBe('2026-03-08');
    expect(plantDateTime('2026-03-08T06:59:00Z', 'America/New_York')).toBe('2026-03-08 01:59');
    expect(plantDateTime('2026-03-08T07:00:00Z', 'America/New_York')).toBe('2026-03-08 03:00');
    // Late evening in New York is already the next day in UTC: the plant's day is shown, not UTC's.
    expect(plantDate('2026-12-06T03:30:00Z', 'America/New_York')).toBe('2026-12-05');
  });
  it(
    'when seconds are asked for, or a calendar day is given, then they are shown as they are; a bad instant is ' +
      'a dash',
    () => {
      expect(plantDateTimeSeconds(new Date('2026-07-01T12:00:09.900Z'), 'UTC')).toBe('2026-07-01 12:00:09');
      expect(plantDateTime('2026-07-01T23:30:00Z', 'UTC')).toBe('2026-07-01 23:30');
      // Midnight is 00, never 24 (ISO 8601-1:2019 §5.3.2 keeps 24:00 only for the end of a day).
      expect(plantDateTime('2026-07-01T23:00:00Z', 'Europe/London')).toBe('2026-07-02 00:00');
      expect(plantDate('2026-11-25', 'Pacific/Auckland')).toBe('2026-11-25');
      expect(plantDateTime('not a time', 'UTC')).toBe('—');
    },
  );
  it('when a zone name is checked, then IANA names pass and offsets or invented names do not', () => {
    expect(isTimeZone('Europe/London')).toBe(true);
    expect(isTimeZone('America/Argentina/Buenos_Aires')).toBe(true);
    expect(isTimeZone('UTC')).toBe(true);
    expect(isTimeZone('Europe/Tarnbridge')).toBe(false);
    expect(isTimeZone('+01:00')).toBe(false);
    expect(isTimeZone('')).toBe(false);
  });
});

describe('times typed on the plant clock', () => {
  it(
    'when a time is typed in the plant, then it names the same instant whatever the browser zone ' +
      '(Europe/London: GMT in December, BST in July)',
    () => {
      expect(instantFromPlantLocal('2026-12-05T15:37', 'Europe/London')!.toISOString()).toBe(
        '2026-12-05T15:37:00.000Z',
      );
      expect(instantFromPlantLocal('2026-07-01T09:00', 'Europe/London')!.toISOString()).toBe(
        '2026-07-01T08:00:00.000Z',
      );
      expect(instantFromPlantLocal('2026-07-01T09:00', 'America/New_York')!.toISOString()).toBe(
        '2026-07-01T13:00:00.000Z',
      );
      expect(plantLocalInput('2026-07-01T08:00:00Z', 'Europe/London')).toBe('2026-07-01T09:00');
    },
  );
  it(
    'when the time falls in the hour the clocks skip or repeat, then it is read before the change or as its ' +
      'first occurrence',
    () => {
      // 29 March 2026: 01:00 GMT becomes 02:00 BST, so 01:30 never shows on a London clock.
      expect(instantFromPlantLocal('2026-03-29T01:30', 'Europe/London')!.toISOString()).toBe(
        '2026-03-29T01:30:00.000Z',
      );
      // 25 October 2026: 01:30 happens twice (BST, then GMT); the first is 00:30 UTC.
      expect(instantFromPlantLocal('2026-10-25T01:30', 'Europe/London')!.toISOString()).toBe(
        '2026-10-25T00:30:00.000Z',
      );
      expect(instantFromPlantLocal('not a time', 'Europe/London')).toBeNull();
    },
  );
});
