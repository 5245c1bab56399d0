import { randomBytes } from 'node:crypto';

/**
 * Seal codes: 10 characters of Crockford's base32 (digits and capitals without I, L, O, U),
 * printed as XXXXX-XXXXX. 50 random bits: guessing a valid code is hopeless at the verify
 * route's rate limit, and the code is short enough to type from paper.
 */
const ALPHABET = '0123456789ABCDEFGHJKMNPQRSTVWXYZ';

export function generateSealCode(): string {
  const bytes = randomBytes(10);
  let out = '';
  for (const b of bytes) out += ALPHABET[b & 31];
  return `${out.slice(0, 5)}-${out.slice(5)}`;
}

/**
 * Reads a code as a person types it: any case, with or without the hyphen or spaces, O for 0
 * and I or L for 1 (Crockford's decoding rules). Returns the printed form, or null when it cannot
 * be a seal code.
 */
export function normalizeSealCode(input: string): string | null {
  const cleaned = input
    .toUpperCase()
    .replace(/[\s-]+/g, '')
    .replace(/O/g, '0')
    .replace(/[IL]/g, '1');
  if (cleaned.length !== 10) return null;
  for (const c of cleaned) if (!ALPHABET.includes(c)) return null;
  return `${cleaned.slice(0, 5)}-${cleaned.slice(5)}`;
}
