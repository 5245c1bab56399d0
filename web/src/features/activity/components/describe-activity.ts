import type { ActivityEntry } from '../../../types/api';

// The activity log in sentences: "Ada Brennan added a member".
const ACTIONS: Record<string, string> = {
  'project.created': 'created the project',
  'project.updated': 'changed the project details',
  'member.added': 'added a member',
  'member.roles_changed': 'changed the roles of a member',
  'member.removed': 'removed a member',
  'user.created': 'added a person',
  'auth.signed_in': 'signed in',
  'auth.signed_out': 'signed out',
  'sheet.created': 'started a sheet',
  'sheet.updated': 'changed a sheet',
  'sheet.draft_saved': 'saved a sheet draft',
  'upload.added': 'uploaded a file',
  'revision.issued': 'issued a revision for check',
  'revision.returned': 'returned a revision to the author',
  'revision.signed_off': 'signed off a revision',
  'revision.sealed': 'sealed a revision',
  'seal.created': 'sealed a revision',
  'remark.added': 'made a remark',
  'remark.replied': 'replied to a remark',
  'remark.answered': 'answered a remark',
  'remark.closed': 'closed a remark',
};

// Recorded for the machine (seed markers), not for the reader.
const HIDDEN_KEYS = new Set(['seeded']);

export function describeAction(action: string): string {
  return ACTIONS[action] ?? action.replaceAll('.', ' ').replaceAll('_', ' ');
}

function describeValue(value: unknown): string | null {
  if (value === null || value === undefined || value === '') return null;
  if (Array.isArray(value)) return value.map((v) => describeValue(v) ?? '').join(', ');
  if (typeof value === 'object') {
    // A change recorded as {from, to} reads "from → to".
    const change = value as { from?: unknown; to?: unknown };
    if ('from' in change || 'to' in change) {
      return `${describeValue(change.from) ?? '—'} → ${describeValue(change.to) ?? '—'}`;
    }
    return JSON.stringify(value);
  }
  const text = String(value);
  // Digests and other long unbroken strings: enough to recognise, not a wall of hex.
  if (text.length > 40 && !/\s/.test(text)) return `${text.slice(0, 12)}…`;
  return text;
}

/** The details as short "key: value" pairs, camelCase keys spelled out. */
export function describeDetails(details: ActivityEntry['details']): string[] {
  if (!details) return [];
  return Object.entries(details).flatMap(([key, value]) => {
    if (HIDDEN_KEYS.has(key)) return [];
    const text = describeValue(value);
    if (text === null) return [];
    const words = key
      .replace(/([a-z])([A-Z])/g, '$1 $2')
      .replaceAll('_', ' ')
      .toLowerCase();
    return [`${words}: ${text}`];
  });
}
