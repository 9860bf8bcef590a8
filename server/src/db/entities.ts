import { Organisation } from '../modules/organisation/organisation.entity';

/** Every entity, listed as imported classes (no globs: tsx emits no decorator metadata for them). */
export const entities = [Organisation];
