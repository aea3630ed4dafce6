import { describe, expect, it } from 'vitest';
import { HANDOFF_STEPS, stepRefusal, type HandoffStep } from '@shared/handoff-rules';
import { STACK_STATES } from '@shared/schemas/sessions';

// The order of stack states is the product brief's (PRODUCT.md, "Stack states"):
// draft → ready → handed-off → merged → archived; taking a hand-off back returns it to ready.
const ALLOWED: Record<HandoffStep, [from: string, to: string]> = {
  'hand-off': ['ready', 'handed-off'],
  'take-back': ['handed-off', 'ready'],
  'upload-merged': ['handed-off', 'merged'],
  archive: ['merged', 'archived'],
};

describe('hand-off steps', () => {
  for (const [step, [from, to]] of Object.entries(ALLOWED) as [HandoffStep, [string, string]][]) {
    it(`${step} goes only ${from} → ${to}, and names the stack and its state when refused`, () => {
      expect(HANDOFF_STEPS[step]).toEqual({ from, to });
      for (const state of STACK_STATES) {
        const refusal = stepRefusal(step, state, 'Stack 07');
        if (state === from) expect(refusal).toBeNull();
        else {
          expect(refusal).toContain('“Stack 07”');
          expect(refusal).toMatch(new RegExp(state.replace('-', '.')));
        }
      }
    });
  }

  it('moves forward through the brief’s order except for taking a hand-off back', () => {
    const rank = (s: string) => STACK_STATES.indexOf(s as (typeof STACK_STATES)[number]);
    for (const [step, { from, to }] of Object.entries(HANDOFF_STEPS)) {
      if (step === 'take-back') expect(rank(to)).toBe(rank(from) - 1);
      else expect(rank(to)).toBe(rank(from) + 1);
    }
  });
});
