// SHA-256 of a file in the browser, so a resumed import can skip what the server already holds.

/** crypto.subtle exists only in secure contexts (https, localhost); without it nothing is skipped. */
export const canHashInBrowser = () => typeof crypto !== 'undefined' && !!crypto.subtle;

export async function sha256OfFile(file: Blob): Promise<string> {
  const digest = await crypto.subtle.digest('SHA-256', await file.arrayBuffer());
  return Array.from(new Uint8Array(digest), (b) => b.toString(16).padStart(2, '0')).join('');
}
