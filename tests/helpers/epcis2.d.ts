/** The part of epcis2.js (npm registry) the tests use: its EPCIS 2.0 document validator. */
declare module 'epcis2.js' {
  export function validateEpcisDocument(
    document: unknown,
    throwError?: boolean,
  ): { success: boolean; errors: string[] };
}
