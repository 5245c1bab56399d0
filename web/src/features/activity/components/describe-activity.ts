import { isGeneratedBlockId } from '../../../lib/block-ids';
import type { ActivityEntry } from '../../../../../core/contract/activity';

// The activity log in sentences a checker can read aloud: "Tomasz Reyes made an error remark on
// DYN-02 Rev 1, line 10", with the facts worth keeping (seal code, purpose, carried remarks) after
// it. Ids stay in the record; the reader gets numbers and names.

export interface DescribedActivity {
  /** What the actor did, without the actor's name. */
  text: string;
  /** Short facts shown under the sentence. */
  facts: string[];
}

type Details = Record<string, unknown>;

const str = (v: unknown): string | null =>
  typeof v === 'string' && v !== '' ? v : typeof v === 'number' ? String(v) : null;
const num = (v: unknown): number | null => (typeof v === 'number' ? v : null);
const list = (v: unknown): string =>
  Array.isArray(v) && v.length > 0 ? v.map(String).join(', ') : 'no roles';
const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;
/** Digests: enough to recognise, not a wall of hex. */
const short = (v: unknown): string | null => {
  const s = str(v);
  return s === null ? null : s.length > 16 ? `${s.slice(0, 12)}…` : s;
};

function bytes(n: number): string {
  if (n < 1024) return `${n} B`;
  if (n < 1024 * 1024) return `${(n / 1024).toFixed(1)} kB`;
  return `${(n / 1024 / 1024).toFixed(1)} MB`;
}

/** "DYN-02" from the entry's sheet (or the number recorded in the details of a deleted sheet). */
function sheetName(entry: ActivityEntry, d: Details): string {
  return entry.sheet?.number ?? str(d.number) ?? 'a sheet';
}

function revisionName(entry: ActivityEntry, d: Details): string {
  const rev = num(d.revisionNumber);
  return rev === null ? sheetName(entry, d) : `${sheetName(entry, d)} Rev ${rev}`;
}

const REFUSALS: Record<string, string> = {
  WRONG_PASSWORD: 'wrong signing password',
};

type Describer = (entry: ActivityEntry, d: Details) => DescribedActivity;

function firmTemplateName(d: Details): string | null {
  const t = d.firmTemplate as { name?: unknown } | undefined;
  return t && typeof t.name === 'string' ? t.name : null;
}

const DESCRIBERS: Record<string, Describer> = {
  'project.created': (_e, d) => ({
    text: 'created the project',
    facts: [str(d.jobNumber), str(d.client)].filter((x): x is string => x !== null),
  }),
  'project.updated': (_e, d) => ({
    text: 'changed the project details',
    facts: changes(d.changes),
  }),
  'member.added': (_e, d) => ({
    text: `added ${str(d.name) ?? str(d.email) ?? 'a member'} as ${list(d.roles)}`,
    facts: [],
  }),
  'member.roles_changed': (_e, d) => ({
    text: `changed the roles of ${str(d.name) ?? str(d.email) ?? 'a member'}`,
    facts: [`${list(d.from)} → ${list(d.to)}`],
  }),
  'member.removed': (_e, d) => ({
    text: `removed ${str(d.name) ?? str(d.email) ?? 'a member'} from the project`,
    facts: Array.isArray(d.roles) ? [`was ${list(d.roles)}`] : [],
  }),
  'user.created': () => ({ text: 'added a person', facts: [] }),
  'auth.signed_in': () => ({ text: 'signed in', facts: [] }),
  'auth.signed_out': () => ({ text: 'signed out', facts: [] }),
  'account.password_changed': (_e, d) => ({
    text: 'changed their password',
    facts: [
      ...(d.signingKeyReencrypted === true ? ['signing key re-encrypted with it'] : []),
      ...(typeof d.otherSessionsEnded === 'number' && d.otherSessionsEnded > 0
        ? [
            `signed out elsewhere (${d.otherSessionsEnded} session${d.otherSessionsEnded === 1 ? '' : 's'})`,
          ]
        : []),
    ],
  }),
  'signing_key.created': () => ({ text: 'created a signing key', facts: [] }),
  'signing_key.retired': () => ({
    text: 'retired a signing key (earlier seals still verify; the next seal makes a new key)',
    facts: [],
  }),
  'sheet.created': (e, d) => ({
    text: `started sheet ${sheetName(e, d)}`,
    facts: [
      str(d.title) ?? e.sheet?.title ?? null,
      str(d.template) && d.template !== 'empty' ? `from the ${String(d.template)} template` : null,
      firmTemplateName(d) ? `from the firm template “${firmTemplateName(d)}”` : null,
    ].filter((x): x is string => x !== null),
  }),
  'template.saved': (e, d) => ({
    text: `saved ${str(d.sheetNumber) ?? sheetName(e, d)} ${
      num(d.revisionNumber) === null ? 'draft' : `Rev ${num(d.revisionNumber)}`
    } as the firm template “${str(d.name) ?? ''}”`,
    facts: [],
  }),
  'template.updated': (_e, d) => ({
    text: `changed the firm template “${str(d.name) ?? ''}”`,
    facts: [],
  }),
  'template.deleted': (_e, d) => ({
    text: `deleted the firm template “${str(d.name) ?? ''}”`,
    facts: [],
  }),
  'sheet.renamed': (e, d) => ({ text: `renamed sheet ${sheetName(e, d)}`, facts: renamed(d) }),
  'sheet.updated': (e, d) => ({ text: `changed sheet ${sheetName(e, d)}`, facts: renamed(d) }),
  'sheet.draft_saved': (e, d) => ({
    text: `saved the draft of ${sheetName(e, d)}`,
    facts: num(d.draftVersion) === null ? [] : [`draft version ${String(d.draftVersion)}`],
  }),
  'sheet.deleted': (e, d) => ({
    text: `deleted sheet ${sheetName(e, d)}`,
    facts: str(d.title) ? [String(d.title)] : [],
  }),
  'upload.added': (e, d) => ({
    text: `uploaded ${str(d.name) ?? 'a file'} to ${sheetName(e, d)}`,
    facts: [
      num(d.rows) !== null && num(d.cols) !== null ? `${String(d.rows)} × ${String(d.cols)}` : null,
      str(d.format)?.toUpperCase() ?? null,
      num(d.size) !== null ? bytes(d.size as number) : null,
      short(d.sha256) ? `SHA-256 ${short(d.sha256)}` : null,
    ].filter((x): x is string => x !== null),
  }),
  'revision.issued': (e, d) => {
    const carried = num(d.remarksCarried) ?? 0;
    const changed = num(d.remarksLineChanged) ?? 0;
    return {
      text: `issued ${revisionName(e, d)} for check`,
      facts: [
        str(d.purpose),
        carried > 0
          ? `${plural(carried, 'open remark')} carried over` +
            (changed > 0 ? `, ${changed} on changed lines` : '')
          : null,
        short(d.canonicalTextDigest) ? `text digest ${short(d.canonicalTextDigest)}` : null,
      ].filter((x): x is string => x !== null),
    };
  },
  'revision.returned': (e, d) => ({
    text: `returned ${revisionName(e, d)} to the author`,
    facts: [],
  }),
  'revision.signed_off': (e, d) => ({
    text: `signed off ${revisionName(e, d)} as checked`,
    facts: [],
  }),
  'revision.sealed': (e, d) => sealed(e, d),
  'seal.created': (e, d) => sealed(e, d),
  'revision.superseded': (e, d) => ({
    text: `marked the seal on ${sheetName(e, d)} superseded`,
    facts: num(d.supersededBy) === null ? [] : [`by Rev ${String(d.supersededBy)}`],
  }),
  'seal.refused': (e, d) => ({
    text: `was refused a seal on ${revisionName(e, d)}`,
    facts: str(d.reason) ? [REFUSALS[String(d.reason)] ?? String(d.reason)] : [],
  }),
  'remark.added': (e, d) => {
    const type = str(d.type);
    const line = num(d.line);
    return {
      text:
        `made ${type ? `${/^[aeiou]/.test(type) ? 'an' : 'a'} ${type} remark` : 'a remark'} on ` +
        `${revisionName(e, d)}${line === null ? '' : `, line ${line}`}`,
      // the block's own name when the author gave it one
      facts:
        str(d.blockId) && !isGeneratedBlockId(String(d.blockId))
          ? [`block ${String(d.blockId)}`]
          : [],
    };
  },
  'remark.replied': (e, d) => ({
    text: `replied to a remark on ${revisionName(e, d)}`,
    facts: d.answered === true ? ['marked it answered'] : [],
  }),
  'remark.reply_edited': (e, d) => ({
    text: `edited a reply on ${revisionName(e, d)}`,
    facts: [],
  }),
  'remark.reply_withdrawn': (e, d) => ({
    text: `withdrew a reply on ${revisionName(e, d)}`,
    facts: [],
  }),
  'remark.answered': (e, d) => ({
    text: `answered a remark on ${revisionName(e, d)}`,
    facts: [],
  }),
  'remark.closed': (e, d) => ({ text: `closed a remark on ${revisionName(e, d)}`, facts: [] }),
  'remark.reopened': (e, d) => ({
    text: `reopened a remark on ${revisionName(e, d)}`,
    facts: [],
  }),
};

function sealed(e: ActivityEntry, d: Details): DescribedActivity {
  const superseded = Array.isArray(d.superseded) ? d.superseded.map(String) : [];
  return {
    text: `sealed ${revisionName(e, d)}`,
    facts: [
      str(d.purpose),
      str(d.sealCode) ? `seal code ${String(d.sealCode)}` : null,
      short(d.digest) ? `digest ${short(d.digest)}` : null,
      superseded.length > 0 ? `supersedes Rev ${superseded.join(', ')}` : null,
    ].filter((x): x is string => x !== null),
  };
}

/** {field: {from, to}} as "field: from → to". */
function changes(value: unknown): string[] {
  if (!value || typeof value !== 'object') return [];
  return Object.entries(value as Record<string, { from?: unknown; to?: unknown }>).map(
    ([key, change]) => `${words(key)}: ${str(change?.from) ?? '—'} → ${str(change?.to) ?? '—'}`,
  );
}

function renamed(d: Details): string[] {
  const from = d.from as Details | undefined;
  const to = d.to as Details | undefined;
  if (!from || !to) return [];
  return Object.keys(to).map((k) => `${words(k)}: ${str(from[k]) ?? '—'} → ${str(to[k]) ?? '—'}`);
}

function words(key: string): string {
  return key
    .replace(/([a-z])([A-Z])/g, '$1 $2')
    .replaceAll('_', ' ')
    .toLowerCase();
}

// Recorded for the machine (seed markers, row ids), not for the reader.
const HIDDEN_KEY = /^(seeded|.*Id|id)$/;

/** An action the list does not know yet: its name in words and its details, ids left out. */
function fallback(entry: ActivityEntry, d: Details): DescribedActivity {
  const facts = Object.entries(d).flatMap(([key, value]) => {
    if (HIDDEN_KEY.test(key)) return [];
    const text = Array.isArray(value)
      ? value.map(String).join(', ')
      : value !== null && typeof value === 'object'
        ? null
        : (short(value) ?? (typeof value === 'boolean' ? (value ? 'yes' : 'no') : null));
    return text ? [`${words(key)}: ${text}`] : [];
  });
  const text = entry.action.replaceAll('.', ' ').replaceAll('_', ' ');
  return { text: entry.sheet ? `${text} (${entry.sheet.number})` : text, facts };
}

/** The entry as a sentence (after the actor's name) and its facts. */
export function describeActivity(entry: ActivityEntry): DescribedActivity {
  const d = entry.details ?? {};
  const describe = DESCRIBERS[entry.action];
  return describe ? describe(entry, d) : fallback(entry, d);
}
