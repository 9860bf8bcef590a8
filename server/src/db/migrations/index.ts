import { CreateOrganisation1764633600000 } from './1764633600000-create-organisation';

/** Every migration in the order it runs. Add new ones at the end. */
export const migrations = [CreateOrganisation1764633600000];
