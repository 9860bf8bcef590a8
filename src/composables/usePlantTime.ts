import { computed } from 'vue';
import { plantDate, plantDateTime, plantDateTimeSeconds, timeZoneNote, type Instant } from '@shared/domain/plant-time';
import { useOrganisation } from './useSystem';

/**
 * Dates and times as people read them everywhere: on the plant's clock, year first, with the
 * plant's zone stated once (in the top bar of every screen). The one formatter for the client.
 */
export function usePlantTime() {
  const organisation = useOrganisation();
  const zone = computed(() => organisation.data.value?.timeZone ?? 'UTC');
  return {
    zone,
    note: computed(() => timeZoneNote(zone.value)),
    /** 2026-12-05 15:37 */
    dateTime: (instant: Instant | null | undefined) => (instant ? plantDateTime(instant, zone.value) : '—'),
    /** 2026-12-05 15:37:08, for signatures and audit trail events */
    dateTimeSeconds: (instant: Instant | null | undefined) =>
      instant ? plantDateTimeSeconds(instant, zone.value) : '—',
    /** 2026-12-05 */
    date: (instant: Instant | null | undefined) => (instant ? plantDate(instant, zone.value) : '—'),
  };
}
