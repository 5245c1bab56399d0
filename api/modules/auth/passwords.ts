import argon2 from 'argon2';

// argon2id with the library's defaults (m = 64 MiB, t = 3, p = 4 in argon2 0.44), the variant
// RFC 9106 recommends for password hashing.
export function hashPassword(password: string): Promise<string> {
  return argon2.hash(password, { type: argon2.argon2id });
}

export async function verifyPassword(hash: string, password: string): Promise<boolean> {
  try {
    return await argon2.verify(hash, password);
  } catch {
    return false;
  }
}

let dummyHash: Promise<string> | undefined;

/**
 * Spends the same time as a real check when the e-mail is unknown, so the answer time does not
 * tell which e-mail addresses have accounts.
 */
export async function spendVerifyTime(password: string): Promise<void> {
  dummyHash ??= hashPassword('modewright-no-such-account');
  await verifyPassword(await dummyHash, password);
}
