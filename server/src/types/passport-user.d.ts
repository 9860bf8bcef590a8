import 'passport';
import type { Person } from '@shared/schemas/people';

declare global {
  namespace Express {
    // The signed-in person, as passport's deserializeUser loads it on every request.
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends Person {}
  }
}
