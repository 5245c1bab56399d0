import type { KeyObject } from 'node:crypto';
import type { SealResponse, SealView } from '../../../core/contract/revisions';
import { dbNow, isDuplicateKeyError, type Db, type DbOrTx } from '../../db/index';
import type { AppContext } from '../../http/context';
import { AppError, NotFoundError } from '../../http/errors';
import { sendAfterCommit } from '../../mail/mailer';
import { activityService } from '../activity/activity.service';
import { verifyPassword } from '../auth/passwords';
import type { User } from '../users/users.repository';
import { usersService } from '../users/users.service';
import { sealedMail } from '../revisions/review-mail';
import { wrongState, type RevisionInScope } from '../revisions/revision-state';
import { lockStatusIs, revisionsService, sheetOf } from '../revisions/revisions.service';
import { sheetsService } from '../sheets/sheets.service';
import { generateSealCode } from './seal-code';
import { buildSealPayload } from './seal-payload';
import { compareResults, REPRODUCE_RELATIVE_TOLERANCE } from './seals.reproduce';
import { sealsRepository, type SealRecord } from './seals.repository';
import {
  createSigningKey,
  publicKeyMatches,
  signDigest,
  SigningKeyLockedError,
  unlockSigningKey,
  type StoredSigningKey,
} from './signing-keys';

/** The seal as a revision shows it: the contract's shape. */
export type { SealView };

export function sealView(seal: SealRecord): SealView {
  return {
    code: seal.code,
    digest: seal.digest,
    signature: seal.signature,
    publicKey: seal.publicKey,
    principal: {
      id: seal.principalId,
      name: seal.principalName,
      licenceNumber: seal.licenceNumber,
      jurisdiction: seal.jurisdiction,
    },
    sealedAt: seal.sealedAt,
    engineVersion: seal.engineVersion,
  };
}

/** The revision may be sealed by this person: signed off, and a licence and jurisdiction stated. */
function checkSealable(
  rev: RevisionInScope['rev'],
  user: User,
): {
  licenceNumber: string;
  jurisdiction: string;
} {
  if (rev.status !== 'checked') {
    throw wrongState(
      rev,
      'only a revision the checker has signed off can be sealed',
      'NOT_SIGNED_OFF',
    );
  }
  if (!user.licenceNumber || !user.jurisdiction) {
    throw new AppError(
      422,
      'NO_LICENCE',
      `Your profile has no ${!user.licenceNumber ? 'licence number' : 'jurisdiction'}: a seal states the principal's licence number and jurisdiction. Ask an administrator to add them.`,
      { field: !user.licenceNumber ? 'licenceNumber' : 'jurisdiction' },
    );
  }
  return { licenceNumber: user.licenceNumber, jurisdiction: user.jurisdiction };
}

/** Records a refused seal (the refusal itself is thrown by the caller). */
async function recordRefusal(
  db: DbOrTx,
  user: User,
  { rev, sheet }: RevisionInScope,
  details: Record<string, unknown>,
): Promise<void> {
  await activityService.record(db, {
    actorId: user.id,
    projectId: sheet.projectId,
    action: 'seal.refused',
    objectType: 'revision',
    objectId: rev.id,
    details: { sheetId: sheet.id, revisionNumber: rev.number, ...details },
  });
}

/**
 * The password typed again, then the person's signing key unlocked with it (made at the first
 * seal). Returns the stored key and its private half.
 */
async function unlockKey(
  db: DbOrTx,
  user: User,
  scope: RevisionInScope,
  password: string,
): Promise<{ key: StoredSigningKey; privateKey: KeyObject }> {
  const hash = await usersService.passwordHashOf(db, user.id);
  if (!hash || !(await verifyPassword(hash, password))) {
    await recordRefusal(db, user, scope, { reason: 'WRONG_PASSWORD' });
    throw new AppError(
      403,
      'WRONG_PASSWORD',
      'The password is not right; type the password you sign in with.',
      {
        field: 'password',
      },
    );
  }

  let key = await sealsRepository.findSigningKey(db, user.id);
  if (!key) {
    key = await createSigningKey(user.id, password);
    await sealsRepository.saveSigningKey(db, key);
    await activityService.record(db, {
      actorId: user.id,
      projectId: null,
      action: 'signing_key.created',
      objectType: 'user',
      objectId: user.id,
      details: { algorithm: 'ed25519' },
    });
  }
  let privateKey;
  try {
    privateKey = await unlockSigningKey(key, password);
  } catch (e) {
    if (!(e instanceof SigningKeyLockedError)) throw e;
    throw new AppError(
      409,
      'SIGNING_KEY_LOCKED',
      'Your signing key is locked under an earlier password and cannot be unlocked with this one. Ask an administrator to send you a password reset link: setting the password from it retires the old key, and your next seal makes a new one.',
    );
  }
  if (!publicKeyMatches(privateKey, key.publicKey)) {
    throw new AppError(
      409,
      'SIGNING_KEY_LOCKED',
      'Your signing key does not match its public key; a new key must be issued.',
    );
  }
  return { key, privateKey };
}

/**
 * A fresh evaluation in a worker, from the revision's own frozen blocks and the sheet's uploads,
 * must give the stored canonical text and reproduce every stored number within relative 1e-9.
 */
async function checkReproduces(ctx: AppContext, user: User, scope: RevisionInScope): Promise<void> {
  const { rev, sheet } = scope;
  const fresh = await sheetsService.evaluate(ctx, sheet.id, sheetOf(rev));
  const stored = JSON.parse(rev.resultsText) as unknown;
  const { moved, total } = compareResults(stored, JSON.parse(fresh.resultsJson) as unknown);
  const textChanged = fresh.canonicalText !== rev.canonicalText;
  if (total === 0 && !textChanged) return;
  await recordRefusal(ctx.db, user, scope, { reason: 'RESULTS_DO_NOT_REPRODUCE', moved: total });
  const list = moved
    .slice(0, 5)
    .map((m) => `${m.where}: stored ${JSON.stringify(m.stored)}, now ${JSON.stringify(m.fresh)}`)
    .join('; ');
  // After an upgrade of the engine the cause is the upgrade, not the revision: say so first.
  const upgraded =
    rev.engineVersion !== fresh.engineVersion
      ? `Rev ${rev.number} was evaluated with ${rev.engineVersion}; this server runs ${fresh.engineVersion}. A seal rests only on results the engine that seals them reproduces: issue a new revision (it is evaluated with the current engine), have it checked, and seal that. `
      : '';
  throw new AppError(
    409,
    'RESULTS_DO_NOT_REPRODUCE',
    textChanged && total === 0
      ? `${upgraded}A fresh evaluation of Rev ${rev.number} does not give the stored canonical text, so it cannot be sealed.`
      : `${upgraded}A fresh evaluation of Rev ${rev.number} does not reproduce its stored results (tolerance: relative ${REPRODUCE_RELATIVE_TOLERANCE} on every number); ${total} value(s) moved: ${list}${total > 5 ? '; …' : ''}. It cannot be sealed; issue a new revision.`,
    {
      details: {
        tolerance: REPRODUCE_RELATIVE_TOLERANCE,
        movedCount: total,
        moved,
        canonicalTextChanged: textChanged,
        storedEngineVersion: rev.engineVersion,
        freshEngineVersion: fresh.engineVersion,
      },
    },
  );
}

/** The signed payload: the revision's digests and the names /verify shows, as they are now. */
function signPayload(
  { rev, sheet }: RevisionInScope,
  user: User,
  licence: { licenceNumber: string; jurisdiction: string },
  sealedAt: Date,
  privateKey: KeyObject,
) {
  const built = buildSealPayload(
    {
      canonicalTextDigest: rev.digests.canonicalText,
      resultsDigest: rev.digests.results,
      engineVersion: rev.engineVersion,
      revisionId: rev.id,
      revisionNumber: rev.number,
      sheetId: sheet.id,
    },
    {
      principalId: user.id,
      principalName: user.name,
      licenceNumber: licence.licenceNumber,
      jurisdiction: licence.jurisdiction,
      sealedAt: sealedAt.toISOString(),
      projectName: sheet.projectName,
      projectJobNumber: sheet.projectJobNumber,
      sheetNumber: sheet.number,
      sheetTitle: sheet.title,
    },
  );
  return { ...built, signature: signDigest(privateKey, built.digest) };
}

type SignedPayload = ReturnType<typeof signPayload>;

/**
 * In one transaction: the revision still signed off, the seal row, the revision and sheet
 * sealed (with the purpose stated at the seal), earlier seals superseded, the activity. A seal code already taken (1 in 2^50 per seal)
 * draws another. Returns the code and the ids of the revisions superseded.
 */
async function storeSeal(
  db: Db,
  user: User,
  { rev, sheet }: RevisionInScope,
  {
    signed,
    publicKey,
    sealedAt,
    purpose,
  }: { signed: SignedPayload; publicKey: string; sealedAt: Date; purpose: string | null },
): Promise<{ code: string; superseded: number[] }> {
  const { payload, payloadVersion, digest, signature } = signed;
  for (let attempt = 0; ; attempt++) {
    const code = generateSealCode();
    try {
      const superseded = await db.transaction(async (trx) => {
        await lockStatusIs(
          trx,
          rev,
          'checked',
          'only a revision the checker has signed off can be sealed',
          'NOT_SIGNED_OFF',
        );
        await sheetsService.lock(trx, sheet.id);
        const earlier = await revisionsService.supersedeEarlier(trx, sheet.id, rev.id, sealedAt);
        await sealsRepository.insert(trx, {
          revisionId: rev.id,
          code,
          principalId: user.id,
          principalName: payload.principalName,
          licenceNumber: payload.licenceNumber,
          jurisdiction: payload.jurisdiction,
          sealedAt,
          canonicalTextDigest: payload.canonicalTextDigest,
          resultsDigest: payload.resultsDigest,
          engineVersion: payload.engineVersion,
          digest,
          signature,
          publicKey,
          payloadVersion,
          projectName: payload.projectName,
          projectJobNumber: payload.projectJobNumber,
          sheetNumber: payload.sheetNumber,
          sheetTitle: payload.sheetTitle,
        });
        await revisionsService.markSealed(trx, rev.id, user.id, sealedAt, purpose);
        await sheetsService.setStatus(trx, sheet.id, 'sealed');
        await activityService.record(trx, {
          actorId: user.id,
          projectId: sheet.projectId,
          action: 'revision.sealed',
          objectType: 'revision',
          objectId: rev.id,
          details: {
            sheetId: sheet.id,
            revisionNumber: rev.number,
            sealCode: code,
            digest,
            superseded: earlier,
            ...(purpose ? { purpose } : {}),
          },
        });
        for (const id of earlier) {
          await activityService.record(trx, {
            actorId: user.id,
            projectId: sheet.projectId,
            action: 'revision.superseded',
            objectType: 'revision',
            objectId: id,
            details: { sheetId: sheet.id, supersededBy: rev.number },
          });
        }
        return earlier;
      });
      return { code, superseded };
    } catch (e) {
      if (isDuplicateKeyError(e) && attempt < 3) continue;
      throw e;
    }
  }
}

/** Every member is told, after the commit, with the revisions the seal superseded. */
async function tellMembers(
  ctx: AppContext,
  user: User,
  { rev, sheet }: RevisionInScope,
  code: string,
  superseded: number[],
): Promise<void> {
  const numbers = (await revisionsService.listBySheet(ctx.db, sheet.id))
    .filter((r) => superseded.includes(r.id))
    .map((r) => r.number);
  const everyone = await revisionsService.emailsOfMembers(ctx, sheet.projectId);
  await sendAfterCommit(
    ctx.mailer,
    ctx.log,
    sealedMail(sheet, everyone, {
      revisionNumber: rev.number,
      by: user.name,
      code,
      supersededNumbers: numbers,
    }),
  );
}

export const sealsService = {
  /**
   * Seal (principal): a signed-off revision, the principal role, a licence number and
   * jurisdiction on the profile, the password typed again, and a fresh evaluation in a worker
   * that reproduces the stored results within relative 1e-9. An optional purpose ("For
   * construction") is stored on the revision and recorded in the activity.
   */
  async seal(
    ctx: AppContext,
    user: User,
    scope: RevisionInScope,
    { password, purpose }: { password: string; purpose: string | null },
  ): Promise<SealResponse> {
    const { db } = ctx;
    const licence = checkSealable(scope.rev, user);
    const { key, privateKey } = await unlockKey(db, user, scope, password);
    await checkReproduces(ctx, user, scope);
    const sealedAt = await dbNow(db);
    const signed = signPayload(scope, user, licence, sealedAt, privateKey);
    const { code, superseded } = await storeSeal(db, user, scope, {
      signed,
      publicKey: key.publicKey,
      sealedAt,
      purpose,
    });
    await tellMembers(ctx, user, scope, code, superseded);
    const seal = await sealsRepository.findByRevision(db, scope.rev.id);
    if (!seal) throw new NotFoundError('The seal was not found after it was made.');
    return { revision: await revisionsService.summary(db, scope.rev.id), seal: sealView(seal) };
  },

  /** The seal of a revision as a revision shows it, or null when it is not sealed. */
  async viewOf(db: DbOrTx, revisionId: number): Promise<SealView | null> {
    const seal = await sealsRepository.findByRevision(db, revisionId);
    return seal ? sealView(seal) : null;
  },

  /** A seal by its code (verify). */
  findByCode(db: DbOrTx, code: string): Promise<SealRecord | undefined> {
    return sealsRepository.findByCode(db, code);
  },

  /** A principal's stored signing key (verify checks the seal's key is the registered one). */
  signingKeyOf(db: DbOrTx, userId: number): Promise<StoredSigningKey | undefined> {
    return sealsRepository.findSigningKey(db, userId);
  },

  /**
   * Whether `publicKey` was the principal's signing key at `sealedAt`: their current key, or a key
   * retired after that moment (a password set from a reset link retires the key it cannot unlock).
   */
  async wasSigningKey(
    db: DbOrTx,
    userId: number,
    publicKey: string,
    sealedAt: Date,
  ): Promise<boolean> {
    const wanted = publicKey.trim();
    const current = await sealsRepository.findSigningKey(db, userId);
    if (current && current.publicKey.trim() === wanted) return true;
    const retired = await sealsRepository.retiredSigningKeys(db, userId);
    return retired.some(
      (k) => k.publicKey.trim() === wanted && k.retiredAt.getTime() >= sealedAt.getTime(),
    );
  },

  /**
   * Retires the person's signing key inside the caller's transaction (a password set without the
   * old one cannot unlock it); their next seal makes a new key. Records signing_key.retired.
   */
  async retireSigningKey(trx: DbOrTx, userId: number, reason: string): Promise<void> {
    if (!(await sealsRepository.retireSigningKey(trx, userId, reason))) return;
    await activityService.record(trx, {
      actorId: userId,
      projectId: null,
      action: 'signing_key.retired',
      objectType: 'user',
      objectId: userId,
      details: { reason },
    });
  },

  /** Stores a principal's signing key (made at the first seal, locked again at a new password). */
  saveSigningKey(db: DbOrTx, key: StoredSigningKey): Promise<void> {
    return sealsRepository.saveSigningKey(db, key);
  },
};
