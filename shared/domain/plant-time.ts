/**
 * One way of writing dates and times for people: the plant's own clock, year first
 * (2026-12-05 15:37), with the zone stated once beside them ("times in Europe/London").
 * ISO 8601 in UTC stays for machine-readable exports.
 */
export type Instant = Date | string;

const formatters = new Map<string, Intl.DateTimeFormat>();
function formatterFor(timeZone: string): Intl.DateTimeFormat {
  let formatter = formatters.get(timeZone);
  if (!formatter) {
    formatter = new Intl.DateTimeFormat('en-GB', {
      timeZone,
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      second: '2-digit',
      hourCycle: 'h23',
    });
    formatters.set(timeZone, formatter);
  }
  return formatter;
}

function partsOf(instant: Instant, timeZone: string) {
  const date = instant instanceof Date ? instant : new Date(instant);
  if (Number.isNaN(date.getTime())) return null;
  const parts = formatterFor(timeZone).formatToParts(date);
  const part = (type: Intl.DateTimeFormatPartTypes) => parts.find((item) => item.type === type)?.value ?? '';
  return {
    day: `${part('year')}-${part('month')}-${part('day')}`,
    minute: `${part('hour')}:${part('minute')}`,
    second: part('second'),
  };
}

/** Date and time to the minute on the plant's clock: "2026-12-05 15:37". */
export function plantDateTime(instant: Instant, timeZone: string): string {
  const parts = partsOf(instant, timeZone);
  return parts ? `${parts.day} ${parts.minute}` : '—';
}

/** Date and time to the second, for signatures and audit trail events: "2026-12-05 15:37:08". */
export function plantDateTimeSeconds(instant: Instant, timeZone: string): string {
  const parts = partsOf(instant, timeZone);
  return parts ? `${parts.day} ${parts.minute}:${parts.second}` : '—';
}

/**
 * The plant's calendar day of an instant ("2026-12-05"). A day that is already a calendar day
 * (YYYY-MM-DD, e.g. a shipping date) is shown as it is: it names no instant to convert.
 */
export function plantDate(instant: Instant, timeZone: string): string {
  if (typeof instant === 'string' && /^\d{4}-\d{2}-\d{2}$/.test(instant)) return instant;
  return partsOf(instant, timeZone)?.day ?? '—';
}

/** The zone's short name at an instant, as a signature prints it ("GMT", "BST", "UTC"). */
export function timeZoneAbbreviation(instant: Instant, timeZone: string): string {
  const date = instant instanceof Date ? instant : new Date(instant);
  return (
    new Intl.DateTimeFormat('en-GB', { timeZone, timeZoneName: 'short' })
      .formatToParts(date)
      .find((part) => part.type === 'timeZoneName')?.value ?? timeZone
  );
}

/** The statement that goes once on each screen and document. */
export const timeZoneNote = (timeZone: string) => `times in ${timeZone}`;

/** Whether a name is an IANA time zone this runtime knows. */
export function isTimeZone(name: string): boolean {
  try {
    new Intl.DateTimeFormat('en-GB', { timeZone: name });
    return /^[A-Za-z_]+(\/[A-Za-z0-9_+-]+)*$/.test(name);
  } catch {
    return false;
  }
}

/** The value a date-and-time input shows for an instant on the plant's clock: "2026-12-05T15:37". */
export function plantLocalInput(instant: Instant, timeZone: string): string {
  const text = plantDateTime(instant, timeZone);
  return text === '—' ? '' : text.replace(' ', 'T');
}

/**
 * The instant a plant-clock date and time names ("2026-12-05T15:37" typed in the plant), whatever
 * the browser's own zone. In the hour skipped when clocks go forward the time is read with the
 * offset before the change; in the hour repeated when they go back, as its first occurrence.
 */
export function instantFromPlantLocal(local: string, timeZone: string): Date | null {
  const match = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})(?::(\d{2}))?$/.exec(local);
  if (!match) return null;
  const [, year, month, day, hour, minute, second] = match.map(Number) as number[];
  const asUtc = Date.UTC(year!, month! - 1, day!, hour!, minute!, Number.isNaN(second) ? 0 : second!);
  // The plant's offset from UTC at an instant: its wall clock read as if it were UTC, less the instant.
  const offsetAt = (utc: number) => {
    const [date, time] = plantDateTimeSeconds(new Date(utc), timeZone).split(' ');
    return Date.parse(`${date}T${time}Z`) - utc;
  };
  const before = offsetAt(asUtc - 14 * 3600_000);
  const after = offsetAt(asUtc + 14 * 3600_000);
  const fits = [...new Set([before, after])]
    .map((offset) => asUtc - offset)
    .filter((utc) => offsetAt(utc) === asUtc - utc);
  return new Date(fits.length ? Math.min(...fits) : asUtc - before);
}

/**
 * The zone's offset from UTC at an instant as ISO 8601 writes it ("+01:00", "-05:00", "+05:30"),
 * from the runtime's time zone database.
 */
export function utcOffset(instant: Instant, timeZone: string): string {
  const date = instant instanceof Date ? instant : new Date(instant);
  const name =
    new Intl.DateTimeFormat('en-GB', { timeZone, timeZoneName: 'longOffset' })
      .formatToParts(date)
      .find((part) => part.type === 'timeZoneName')?.value ?? 'GMT';
  const match = /^GMT([+-])(\d{2}):(\d{2})$/.exec(name);
  return match ? `${match[1]}${match[2]}:${match[3]}` : '+00:00';
}
