import { describe, expect, it } from 'vitest';
import { ACCESS_RULES, decide, type AccessAction } from '../../api/http/access';
import type { ProjectRole } from '../../core/vocabulary';

// The one access policy as a table of role × action (DESIGN §7: authors write, checkers check,
// the principal seals, viewers read; an admin reads every project and manages people, but does
// not write, check or seal a project's work without holding the role). ✓ = allowed, ✗ = 403.

type Who = 'author' | 'checker' | 'principal' | 'viewer' | 'admin' | 'outsider';
const WHO: Who[] = ['author', 'checker', 'principal', 'viewer', 'admin', 'outsider'];

//                         author checker principal viewer admin outsider
const TABLE: Record<AccessAction, string> = {
  'project.read': '        ✓      ✓       ✓         ✓      ✓     ✗',
  'sheet.read': '          ✓      ✓       ✓         ✓      ✓     ✗',
  'sheet.read_internal': ' ✓      ✓       ✓         ✗      ✓     ✗',
  'sheet.evaluate': '      ✓      ✓       ✓         ✗      ✗     ✗',
  'sheet.create': '        ✓      ✗       ✗         ✗      ✗     ✗',
  'sheet.rename': '        ✓      ✗       ✗         ✗      ✗     ✗',
  'sheet.edit': '          ✓      ✗       ✗         ✗      ✗     ✗',
  'sheet.delete': '        ✓      ✗       ✗         ✗      ✗     ✗',
  'upload.add': '          ✓      ✗       ✗         ✗      ✗     ✗',
  'revision.issue': '      ✓      ✗       ✗         ✗      ✗     ✗',
  'revision.return': '     ✗      ✓       ✗         ✗      ✗     ✗',
  'revision.sign_off': '   ✗      ✓       ✗         ✗      ✗     ✗',
  'remark.add': '          ✗      ✓       ✗         ✗      ✗     ✗',
  'remark.reply': '        ✓      ✓       ✗         ✗      ✗     ✗',
  'remark.set_state': '    ✗      ✓       ✗         ✗      ✗     ✗',
  'revision.seal': '       ✗      ✗       ✓         ✗      ✗     ✗',
  'template.save': '       ✓      ✗       ✗         ✗      ✓     ✗',
};

function person(who: Who): { actor: { id: number; isAdmin: boolean }; held: ProjectRole[] } {
  if (who === 'admin') return { actor: { id: 1, isAdmin: true }, held: [] };
  if (who === 'outsider') return { actor: { id: 2, isAdmin: false }, held: [] };
  return { actor: { id: 3, isAdmin: false }, held: [who] };
}

function allowed(action: AccessAction, who: Who): boolean {
  const { actor, held } = person(who);
  try {
    decide(ACCESS_RULES[action], actor, held);
    return true;
  } catch (e) {
    expect(e).toMatchObject({ status: 403, code: 'FORBIDDEN' });
    return false;
  }
}

describe('the access policy (api/http/access.ts)', () => {
  it('covers every action of the policy in the table', () => {
    expect(Object.keys(TABLE).sort()).toEqual(Object.keys(ACCESS_RULES).sort());
  });

  for (const [action, row] of Object.entries(TABLE) as [AccessAction, string][]) {
    it(`decides ${action} for each role as the table says`, () => {
      const expected = row.trim().split(/\s+/);
      expect(expected).toHaveLength(WHO.length);
      const got = WHO.map((who) => (allowed(action, who) ? '✓' : '✗'));
      expect(got).toEqual(expected);
    });
  }

  it('names who may in the refusal, and refuses a non-member before looking at roles', () => {
    const viewer = person('viewer');
    expect(() => decide(ACCESS_RULES['revision.issue'], viewer.actor, viewer.held)).toThrow(
      'Only an author of this project can issue a sheet for check.',
    );
    expect(() => decide(ACCESS_RULES['remark.reply'], viewer.actor, viewer.held)).toThrow(
      'Only an author or checker of this project can reply to remarks.',
    );
    expect(() => decide(ACCESS_RULES['revision.seal'], viewer.actor, viewer.held)).toThrow(
      'Only the principal of this project can seal a revision.',
    );
    const outsider = person('outsider');
    expect(() => decide(ACCESS_RULES['sheet.read'], outsider.actor, outsider.held)).toThrow(
      'You are not a member of this project.',
    );
  });

  it('counts every role a person holds', () => {
    const both = { id: 4, isAdmin: false };
    expect(() =>
      decide(ACCESS_RULES['revision.seal'], both, ['author', 'principal']),
    ).not.toThrow();
    expect(() =>
      decide(ACCESS_RULES['revision.issue'], both, ['author', 'principal']),
    ).not.toThrow();
  });
});
