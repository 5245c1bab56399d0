// The public verification of a seal code (/api/verify/:code).
import { z } from 'zod';
import { isoTime } from './common';

export const verdict = z.enum(['genuine', 'does-not-match', 'unknown-code']);
export type Verdict = z.infer<typeof verdict>;

/** Today's names where they differ from the sealed ones: shown as "now titled …", not sealed. */
export const nowNames = z.strictObject({
  sheetNumber: z.string().optional(),
  sheetTitle: z.string().optional(),
  projectJobNumber: z.string().optional(),
  projectName: z.string().optional(),
});
export type NowNames = z.infer<typeof nowNames>;

export const verifyResult = z.strictObject({
  verdict,
  code: z.string().nullable(),
  sheet: z.strictObject({ number: z.string(), title: z.string() }).nullable(),
  project: z.strictObject({ jobNumber: z.string(), name: z.string() }).nullable(),
  revision: z
    .strictObject({
      number: z.number().int(),
      status: z.string(),
      supersededAt: isoTime.nullable(),
    })
    .nullable(),
  principal: z
    .strictObject({ name: z.string(), licenceNumber: z.string(), jurisdiction: z.string() })
    .nullable(),
  sealedAt: isoTime.nullable(),
  digest: z.string().nullable(),
  /**
   * 2: sheet, project and principal above are the values signed at sealing. 1 (older seals): the
   * digest covers the revision, licence and time only; sheet, project, principal name and
   * jurisdiction are shown as stored and are not part of the seal.
   */
  payloadVersion: z.number().int().nullable(),
  now: nowNames.nullable(),
  /** Why it does not match (empty when genuine); notes that do not change the verdict follow. */
  reasons: z.array(z.string()),
  notes: z.array(z.string()),
});
export type VerifyResult = z.infer<typeof verifyResult>;
