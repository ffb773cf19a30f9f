/** What a Cairn session holds once someone has signed in (stored in MariaDB, never in memory). */
import 'express-session';

export interface SessionAuth {
  userId: number;
  /** Epoch milliseconds of the sign-in: the absolute timeout counts from here */
  signedInAt: number;
  /** Epoch milliseconds of the last request (updated at most once a minute) */
  lastSeenAt: number;
  /** The synchroniser token every state-changing request must echo in X-CSRF-Token */
  csrfToken: string;
  /** From the assertion, for single logout */
  nameId: string;
  nameIdFormat: string | null;
  sessionIndex: string | null;
}

declare module 'express-session' {
  interface SessionData {
    auth?: SessionAuth;
  }
}
