import {
  createCipheriv,
  createDecipheriv,
  createPrivateKey,
  createPublicKey,
  generateKeyPairSync,
  randomBytes,
  scrypt,
  sign,
  verify,
  type KeyObject,
  type ScryptOptions,
} from 'node:crypto';

/**
 * A principal's Ed25519 signing key as it is stored: the public key in the clear (SPKI PEM), the
 * private key (PKCS#8 DER) encrypted with AES-256-GCM under a key derived from the principal's
 * password with scrypt (RFC 7914). The additional authenticated data binds the ciphertext to the
 * person, so a row copied onto another person does not unlock.
 */
export interface StoredSigningKey {
  userId: number;
  algorithm: 'ed25519';
  publicKey: string;
  encryptedPrivateKey: string;
  authTag: string;
  nonce: string;
  salt: string;
  kdfParams: ScryptParams;
}

export interface ScryptParams {
  name: 'scrypt';
  N: number;
  r: number;
  p: number;
  keyLength: number;
}

/**
 * N = 2^15, r = 8, p = 1: the interactive-login parameters RFC 7914 §2 discusses and OWASP's
 * password storage cheat sheet lists for scrypt (from memory); about 32 MiB and a tenth of a
 * second here, paid once per seal or password change.
 */
export const DEFAULT_SCRYPT: ScryptParams = {
  name: 'scrypt',
  N: 2 ** 15,
  r: 8,
  p: 1,
  keyLength: 32,
};

/** The password does not unlock the key (GCM authentication failed). */
export class SigningKeyLockedError extends Error {
  constructor() {
    super('The password does not unlock the signing key.');
    this.name = 'SigningKeyLockedError';
  }
}

function deriveKey(password: string, salt: Buffer, params: ScryptParams): Promise<Buffer> {
  const options: ScryptOptions = {
    N: params.N,
    r: params.r,
    p: params.p,
    // 128·N·r bytes plus headroom; Node refuses above maxmem.
    maxmem: 256 * params.N * params.r,
  };
  return new Promise((resolve, reject) => {
    scrypt(password.normalize('NFC'), salt, params.keyLength, options, (err, key) =>
      err ? reject(err) : resolve(key),
    );
  });
}

function aadFor(userId: number): Buffer {
  return Buffer.from(`modewright-signing-key:v1:user:${userId}`, 'utf8');
}

async function encryptPrivateKey(
  userId: number,
  privateDer: Buffer,
  password: string,
  params: ScryptParams,
): Promise<
  Pick<StoredSigningKey, 'encryptedPrivateKey' | 'authTag' | 'nonce' | 'salt' | 'kdfParams'>
> {
  const salt = randomBytes(16);
  const nonce = randomBytes(12);
  const key = await deriveKey(password, salt, params);
  const cipher = createCipheriv('aes-256-gcm', key, nonce);
  cipher.setAAD(aadFor(userId));
  const ciphertext = Buffer.concat([cipher.update(privateDer), cipher.final()]);
  return {
    encryptedPrivateKey: ciphertext.toString('base64'),
    authTag: cipher.getAuthTag().toString('base64'),
    nonce: nonce.toString('base64'),
    salt: salt.toString('base64'),
    kdfParams: params,
  };
}

/** Generates a fresh Ed25519 key pair for a principal, the private half locked by the password. */
export async function createSigningKey(
  userId: number,
  password: string,
  params: ScryptParams = DEFAULT_SCRYPT,
): Promise<StoredSigningKey> {
  const { publicKey, privateKey } = generateKeyPairSync('ed25519');
  const privateDer = privateKey.export({ format: 'der', type: 'pkcs8' });
  const locked = await encryptPrivateKey(userId, privateDer, password, params);
  return {
    userId,
    algorithm: 'ed25519',
    publicKey: publicKey.export({ format: 'pem', type: 'spki' }).toString(),
    ...locked,
  };
}

/** Decrypts the private key; throws SigningKeyLockedError when the password is not the one. */
export async function unlockSigningKey(
  stored: StoredSigningKey,
  password: string,
): Promise<KeyObject> {
  const key = await deriveKey(password, Buffer.from(stored.salt, 'base64'), stored.kdfParams);
  const decipher = createDecipheriv('aes-256-gcm', key, Buffer.from(stored.nonce, 'base64'));
  decipher.setAAD(aadFor(stored.userId));
  decipher.setAuthTag(Buffer.from(stored.authTag, 'base64'));
  let der: Buffer;
  try {
    der = Buffer.concat([
      decipher.update(Buffer.from(stored.encryptedPrivateKey, 'base64')),
      decipher.final(),
    ]);
  } catch {
    throw new SigningKeyLockedError();
  }
  return createPrivateKey({ key: der, format: 'der', type: 'pkcs8' });
}

/** Same key pair, locked under the new password with a fresh salt and nonce. */
export async function reencryptSigningKey(
  stored: StoredSigningKey,
  currentPassword: string,
  newPassword: string,
): Promise<StoredSigningKey> {
  const privateKey = await unlockSigningKey(stored, currentPassword);
  const der = privateKey.export({ format: 'der', type: 'pkcs8' });
  const locked = await encryptPrivateKey(stored.userId, der, newPassword, stored.kdfParams);
  return { ...stored, ...locked };
}

/** Ed25519 signature (RFC 8032) of the 32 digest bytes, base64. */
export function signDigest(privateKey: KeyObject, digestHex: string): string {
  return sign(null, Buffer.from(digestHex, 'hex'), privateKey).toString('base64');
}

/** True when the signature is the public key's Ed25519 signature of the digest. */
export function verifyDigest(
  publicKeyPem: string,
  digestHex: string,
  signatureBase64: string,
): boolean {
  try {
    const publicKey = createPublicKey(publicKeyPem);
    return verify(
      null,
      Buffer.from(digestHex, 'hex'),
      publicKey,
      Buffer.from(signatureBase64, 'base64'),
    );
  } catch {
    return false;
  }
}

/** True when the PEM public key belongs to the unlocked private key. */
export function publicKeyMatches(privateKey: KeyObject, publicKeyPem: string): boolean {
  const derived = createPublicKey(privateKey).export({ format: 'pem', type: 'spki' }).toString();
  return derived.trim() === publicKeyPem.trim();
}
