// Migrations in the order they run. Add each new migration here.
import { Foundation1733000000000 } from './1733000000000-foundation';
import { KitAndPlans1733000001000 } from './1733000001000-kit-and-plans';
import { SessionsAndFrames1733000002000 } from './1733000002000-sessions-and-frames';
import { StackHandoffColumns1733000003000 } from './1733000003000-stack-handoff-columns';
import { Bundles1733000004000 } from './1733000004000-bundles';
import { Handoff1733000005000 } from './1733000005000-handoff';
import { StackChecks1733000006000 } from './1733000006000-stack-checks';

export const migrations = [Foundation1733000000000, KitAndPlans1733000001000, SessionsAndFrames1733000002000, StackHandoffColumns1733000003000, Bundles1733000004000, Handoff1733000005000, StackChecks1733000006000];
