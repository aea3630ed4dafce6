import type { Role } from '../shared/roles';

declare global {
  namespace Express {
    interface User {
      id: string;
      email: string;
      name: string;
      lastStudioId: string | null;
    }
    interface Request {
      member?: { studioId: string; role: Role; membershipId: string };
    }
  }
}

export {};
