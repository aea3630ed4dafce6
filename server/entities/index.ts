// The list TypeORM loads. Add each new entity here.
import { User } from './user';
import { CaughtMail, Invitation, Membership, PasswordReset, Studio } from './studio';
import { KitBody, KitExtensionSet, KitLens, KitRail } from './kit';
import { Plan } from './plan';
import { CardImport, Frame, ShootSession, SortingSnapshot, Stack, StackEvent, StoredFile } from './session';
import { Bundle, ContactSheet } from './bundle';
import { MergedResult, ShareLink } from './handoff';
import { StackCheckRun, StudioCheckThresholds } from './stack-checks';

export const entities = [User, Studio, Membership, Invitation, PasswordReset, CaughtMail, KitBody, KitLens, KitExtensionSet, KitRail, Plan, ShootSession, CardImport, StoredFile, Stack, Frame, SortingSnapshot, StackEvent, ShareLink, MergedResult, Bundle, ContactSheet, StackCheckRun, StudioCheckThresholds];
