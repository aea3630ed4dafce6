// Migrations in the order they run. Add each new migration here.
import { Foundation1733000000000 } from './1733000000000-foundation';

export const migrations = [Foundation1733000000000];
