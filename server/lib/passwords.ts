import argon2 from 'argon2';

// argon2id with the library's defaults (m=64 MiB, t=3, p=4): RFC 9106's second recommended option.
export function hashPassword(password: string): Promise<string> {
  return argon2.hash(password, { type: argon2.argon2id });
}

export function verifyPassword(hash: string, password: string): Promise<boolean> {
  return argon2.verify(hash, password).catch(() => false);
}

let dummyHash: Promise<string> | undefined;
/** Spend the same time on an unknown e-mail as on a wrong password, so timing tells nothing. */
export async function burnVerifyTime(password: string): Promise<void> {
  dummyHash ??= hashPassword('not-a-real-password-for-timing');
  await verifyPassword(await dummyHash, password);
}
