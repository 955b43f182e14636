import argon2 from 'argon2';

// OWASP Password Storage Cheat Sheet minimum for argon2id: 19 MiB memory, 2 iterations, 1 lane.
const OPTIONS = { type: argon2.argon2id, memoryCost: 19 * 1024, timeCost: 2, parallelism: 1 } as const;

export const hashPassword = (plain: string) => argon2.hash(plain, OPTIONS);

/** Verifies; a missing hash still costs one verification so timing does not reveal unknown accounts. */
let dummyHash: Promise<string> | null = null;
export async function verifyPassword(hash: string | null, plain: string): Promise<boolean> {
  if (!hash) {
    dummyHash ??= hashPassword('parapet-timing-equaliser');
    await argon2.verify(await dummyHash, plain).catch(() => false);
    return false;
  }
  return argon2.verify(hash, plain).catch(() => false);
}
