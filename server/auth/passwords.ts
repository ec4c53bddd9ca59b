import bcrypt from 'bcryptjs';
import crypto from 'node:crypto';

const COST = 10;

export const hashPassword = (plain: string) => bcrypt.hash(plain, COST);
export const verifyPassword = (plain: string, hash: string) => bcrypt.compare(plain, hash);

/** A hash of a random password, compared against when the e-mail is unknown, so that
 *  a wrong e-mail and a wrong password take the same time and give the same answer. */
let dummyHash: string | null = null;
export async function dummyVerify(plain: string): Promise<false> {
  dummyHash ??= await hashPassword(crypto.randomBytes(16).toString('hex'));
  await bcrypt.compare(plain, dummyHash);
  return false;
}

/** A readable one-time password for a newly added member (shown once). */
export function generatePassword(): string {
  return crypto.randomBytes(12).toString('base64url');
}
