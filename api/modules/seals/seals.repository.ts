import type { DbOrTx } from '../../db/index';
import type { ScryptParams, StoredSigningKey } from './signing-keys';

export interface SealRecord {
  id: number;
  revisionId: number;
  code: string;
  principalId: number;
  principalName: string;
  licenceNumber: string;
  jurisdiction: string;
  sealedAt: string;
  canonicalTextDigest: string;
  resultsDigest: string;
  engineVersion: string;
  digest: string;
  signature: string;
  publicKey: string;
  /** 1: the digest covers the revision, principal, licence and time; 2: the names too. */
  payloadVersion: number;
  /** As at sealing; null on a version-1 seal. */
  projectName: string | null;
  projectJobNumber: string | null;
  sheetNumber: string | null;
  sheetTitle: string | null;
}

export type NewSeal = Omit<SealRecord, 'id' | 'sealedAt'> & { sealedAt: Date };

interface SealRow {
  id: number;
  revision_id: number;
  code: string;
  principal_id: number;
  principal_name: string;
  licence_number: string;
  jurisdiction: string;
  sealed_at: Date;
  canonical_text_digest: string;
  results_digest: string;
  engine_version: string;
  digest: string;
  signature: string;
  public_key: string;
  payload_version: number;
  project_name: string | null;
  project_job_number: string | null;
  sheet_number: string | null;
  sheet_title: string | null;
}

interface SigningKeyRow {
  user_id: number;
  algorithm: string;
  public_key: string;
  encrypted_private_key: string;
  auth_tag: string;
  nonce: string;
  salt: string;
  kdf_params: string;
}

function toSeal(row: SealRow): SealRecord {
  return {
    id: row.id,
    revisionId: row.revision_id,
    code: row.code,
    principalId: row.principal_id,
    principalName: row.principal_name,
    licenceNumber: row.licence_number,
    jurisdiction: row.jurisdiction,
    sealedAt: new Date(row.sealed_at).toISOString(),
    canonicalTextDigest: row.canonical_text_digest,
    resultsDigest: row.results_digest,
    engineVersion: row.engine_version,
    digest: row.digest,
    signature: row.signature,
    publicKey: row.public_key,
    payloadVersion: row.payload_version,
    projectName: row.project_name,
    projectJobNumber: row.project_job_number,
    sheetNumber: row.sheet_number,
    sheetTitle: row.sheet_title,
  };
}

function toKey(row: SigningKeyRow): StoredSigningKey {
  return {
    userId: row.user_id,
    algorithm: 'ed25519',
    publicKey: row.public_key,
    encryptedPrivateKey: row.encrypted_private_key,
    authTag: row.auth_tag,
    nonce: row.nonce,
    salt: row.salt,
    kdfParams: JSON.parse(row.kdf_params) as ScryptParams,
  };
}

export const sealsRepository = {
  async findByRevision(db: DbOrTx, revisionId: number): Promise<SealRecord | undefined> {
    const row = (await db('seals').where({ revision_id: revisionId }).first()) as
      SealRow | undefined;
    return row ? toSeal(row) : undefined;
  },

  async findByCode(db: DbOrTx, code: string): Promise<SealRecord | undefined> {
    const row = (await db('seals').where({ code }).first()) as SealRow | undefined;
    return row ? toSeal(row) : undefined;
  },

  async insert(db: DbOrTx, s: NewSeal): Promise<number> {
    const [id] = await db('seals').insert({
      revision_id: s.revisionId,
      code: s.code,
      principal_id: s.principalId,
      principal_name: s.principalName,
      licence_number: s.licenceNumber,
      jurisdiction: s.jurisdiction,
      sealed_at: s.sealedAt,
      canonical_text_digest: s.canonicalTextDigest,
      results_digest: s.resultsDigest,
      engine_version: s.engineVersion,
      digest: s.digest,
      signature: s.signature,
      public_key: s.publicKey,
      payload_version: s.payloadVersion,
      project_name: s.projectName,
      project_job_number: s.projectJobNumber,
      sheet_number: s.sheetNumber,
      sheet_title: s.sheetTitle,
    });
    if (id === undefined) throw new Error('seals insert returned no id');
    return id;
  },

  async findSigningKey(db: DbOrTx, userId: number): Promise<StoredSigningKey | undefined> {
    const row = (await db('signing_keys').where({ user_id: userId }).first()) as
      SigningKeyRow | undefined;
    return row ? toKey(row) : undefined;
  },

  /** Inserts the key, or replaces its locked private half after a password change. */
  async saveSigningKey(db: DbOrTx, key: StoredSigningKey): Promise<void> {
    const values = {
      algorithm: key.algorithm,
      public_key: key.publicKey,
      encrypted_private_key: key.encryptedPrivateKey,
      auth_tag: key.authTag,
      nonce: key.nonce,
      salt: key.salt,
      kdf_params: JSON.stringify(key.kdfParams),
      updated_at: db.fn.now(3),
    };
    await db('signing_keys')
      .insert({ user_id: key.userId, ...values })
      .onConflict('user_id')
      .merge(values);
  },

  /**
   * Retires the person's signing key, if they have one: its public half moves to
   * retired_signing_keys with the time it stopped signing, and the row in signing_keys goes.
   * Returns whether there was a key.
   */
  async retireSigningKey(db: DbOrTx, userId: number, reason: string): Promise<boolean> {
    const row = (await db('signing_keys').where({ user_id: userId }).forUpdate().first()) as
      (SigningKeyRow & { created_at: Date }) | undefined;
    if (!row) return false;
    await db('retired_signing_keys').insert({
      user_id: userId,
      algorithm: row.algorithm,
      public_key: row.public_key,
      created_at: row.created_at,
      retired_at: db.fn.now(3),
      reason,
    });
    await db('signing_keys').where({ user_id: userId }).delete();
    return true;
  },

  /** The public halves of the person's retired keys, with when each stopped signing. */
  async retiredSigningKeys(
    db: DbOrTx,
    userId: number,
  ): Promise<{ publicKey: string; retiredAt: Date }[]> {
    const rows = (await db('retired_signing_keys')
      .where({ user_id: userId })
      .select('public_key', 'retired_at')) as { public_key: string; retired_at: Date }[];
    return rows.map((r) => ({ publicKey: r.public_key, retiredAt: new Date(r.retired_at) }));
  },
};
