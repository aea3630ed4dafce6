// Which hand-off step may start from which stack state (PRODUCT.md, "Stack states"):
// draft → ready → handed-off → merged → archived, with a hand-off taken back to ready.
import type { StackState } from './schemas/sessions';

export type HandoffStep = 'hand-off' | 'take-back' | 'upload-merged' | 'archive';

export const HANDOFF_STEPS: Record<HandoffStep, { from: StackState; to: StackState }> = {
  'hand-off': { from: 'ready', to: 'handed-off' },
  'take-back': { from: 'handed-off', to: 'ready' },
  'upload-merged': { from: 'handed-off', to: 'merged' },
  archive: { from: 'merged', to: 'archived' },
};

const quote = (name: string) => `“${name}”`;
const STATE_WORDS: Record<StackState, string> = { draft: 'a draft', ready: 'ready', 'handed-off': 'handed off', merged: 'merged', archived: 'archived' };

/** null when the step may start from this state, else the reason it may not, for a person. */
export function stepRefusal(step: HandoffStep, state: StackState, stackName: string): string | null {
  if (HANDOFF_STEPS[step].from === state) return null;
  const s = quote(stackName);
  const is = STATE_WORDS[state];
  switch (step) {
    case 'hand-off':
      if (state === 'draft') return `${s} is still a draft; only ready stacks can be handed off. Check it and mark it ready first.`;
      if (state === 'handed-off') return `${s} is already handed off. Take it back first to hand it to someone else.`;
      return `${s} is ${is}; only ready stacks can be handed off.`;
    case 'take-back':
      if (state === 'merged' || state === 'archived') return `${s} is ${is}: its merged result is in, so there is no hand-off left to take back.`;
      return `${s} is ${is}; only a handed-off stack can be taken back.`;
    case 'upload-merged':
      if (state === 'merged' || state === 'archived') return `${s} is ${is}: it already has its merged result.`;
      return `${s} is ${is}; a merged result can only be added while the stack is handed off.`;
    case 'archive':
      return `${s} is ${is}; only merged stacks can be archived.`;
  }
}

export const STACK_STATE_LABELS: Record<StackState, string> = {
  draft: 'Draft',
  ready: 'Ready',
  'handed-off': 'Handed off',
  merged: 'Merged',
  archived: 'Archived',
};
