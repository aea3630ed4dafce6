import type { Request } from 'express';
import { csrfSync } from 'csrf-sync';

// Synchroniser-token pattern: the token lives in the server-side session and every state-changing
// request must echo it in the X-CSRF-Token header (OWASP CSRF Prevention Cheat Sheet).
const sync = csrfSync({
  getTokenFromRequest: (req) => req.get('x-csrf-token') ?? undefined,
  errorConfig: { statusCode: 403, message: 'The form is out of date (CSRF token missing or wrong). Reload the page and try again.', code: 'csrf' },
});

export const csrfProtection = sync.csrfSynchronisedProtection;

export function csrfToken(req: Request): string {
  return sync.generateToken(req);
}
