// The list TypeORM loads. Add each new entity here.
import { User } from './user';
import { CaughtMail, Invitation, Membership, PasswordReset, Studio } from './studio';

export const entities = [User, Studio, Membership, Invitation, PasswordReset, CaughtMail];
