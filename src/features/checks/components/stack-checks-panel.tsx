// Placeholder until the stack checks feature lands; that work replaces this file.
export function StackChecksPanel(_props: { stackId: string }) {
  return null;
}
