// Storage keys of the files made from a stack: contact sheets per stack version, bundles per
// bundle row. Under the session's folder, so they go with the session.
export const stackFileKeys = {
  contactSheet: (sessionId: string, stackId: string, version: number, ext: 'jpg' | 'pdf') =>
    `sessions/${sessionId}/stacks/${stackId}/v${version}/contact-sheet.${ext}`,
  bundle: (sessionId: string, bundleId: string) => `sessions/${sessionId}/bundles/${bundleId}.zip`,
};
