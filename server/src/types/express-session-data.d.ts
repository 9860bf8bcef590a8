import 'express-session';

declare module 'express-session' {
  interface SessionData {
    signedInAt: number;
    lastSeenAt: number;
    csrfToken: string;
  }
}
