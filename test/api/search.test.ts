import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  anonymous,
  createSheetWithDraft,
  createTeamApp,
  signedIn,
  type ApiClient,
  type TestApp,
} from '../support/api-app';
import {
  createProject,
  createProjectTeam,
  createUser,
  addMember,
  unique,
} from '../support/factories';

// Search across the projects a person may open, through MariaDB's full-text indexes. Every run
// invents words of its own, so rows left by earlier runs never match.

let t: TestApp;
let team: Awaited<ReturnType<typeof createProjectTeam>>;
let author: ApiClient;
let checker: ApiClient;
let viewer: ApiClient;
let outsider: ApiClient;
let admin: ApiClient;

const tag = unique()
  .toLowerCase()
  .replace(/[^a-z0-9]/g, '');
const word = (stem: string) => `${stem}${tag}`;
let sheetId: number;
let sheetNumber: string;
let revisionId: number;
let remarkId: number;

beforeAll(async () => {
  ({
    t,
    team,
    clients: { author, checker, viewer, outsider, admin },
  } = await createTeamApp(['author', 'checker', 'viewer', 'outsider', 'admin']));
  sheetNumber = `SR-${tag}`;
  const sheet = await createSheetWithDraft(
    author,
    team.project.id,
    { number: sheetNumber, title: `Deck ${word('quaywobble')} check` },
    [
      { id: 'intro', kind: 'text', source: `## Deck\nThe ${word('footfall')} rate is assumed.` },
      {
        id: 'masses',
        kind: 'calc',
        source: `m1 = 18 t\nk1 = 24 kN/mm # ${word('bearingpad')} stiffness`,
      },
    ],
  );
  sheetId = sheet.id;
  const rev = await author.post(`/api/sheets/${sheetId}/revisions`, { purpose: 'For check' });
  expect(rev.status).toBe(201);
  revisionId = rev.body.revision.id;
  const remark = await checker.post(`/api/revisions/${revisionId}/remarks`, {
    blockId: 'masses',
    line: 2,
    type: 'query',
    text: `Is the ${word('elastomer')} stiffness from the supplier?`,
  });
  expect(remark.status).toBe(201);
  remarkId = remark.body.remark.id;
  const reply = await author.post(`/api/remarks/${remarkId}/replies`, {
    text: `Yes, from the ${word('datasheet')} of the bearing.`,
  });
  expect(reply.status).toBe(201);
});

afterAll(async () => {
  await t?.close();
});

const search = (client: ApiClient, q: string) =>
  client.get(`/api/search?q=${encodeURIComponent(q)}`);

describe('GET /api/search', () => {
  it('answers 401 when signed out', async () => {
    expect((await search(await anonymous(t.app), word('quaywobble'))).status).toBe(401);
  });

  it('answers 422 on q when nothing is typed', async () => {
    const res = await viewer.get('/api/search?q=%20%20');
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('q');
  });

  it('finds a sheet by a word of its title and says which field holds it', async () => {
    const res = await search(author, word('quaywobble'));
    expect(res.status).toBe(200);
    expect(res.body.results).toEqual([
      {
        kind: 'sheet',
        project: {
          id: team.project.id,
          jobNumber: team.project.jobNumber,
          name: team.project.name,
        },
        sheet: {
          id: sheetId,
          number: sheetNumber,
          title: `Deck ${word('quaywobble')} check`,
          subject: '',
        },
        fields: ['title'],
        place: null,
      },
    ]);
  });

  it('finds the block and line of a word in the draft’s text and calc sources, by word start', async () => {
    const text = await search(author, word('footfall'));
    expect(text.body.results).toHaveLength(1);
    expect(text.body.results[0].place).toEqual({
      revision: null,
      blockId: 'intro',
      blockIndex: 1,
      blockKind: 'text',
      line: 2,
      text: `The ${word('footfall')} rate is assumed.`,
    });
    // A prefix finds the whole word (boolean mode's trailing *).
    const calc = await search(checker, word('bearingpad').slice(0, -2));
    expect(calc.body.results[0].place).toMatchObject({
      revision: null,
      blockId: 'masses',
      blockIndex: 2,
      line: 2,
    });
  });

  it('gives a viewer, who may not read the draft, the place in the newest revision', async () => {
    const text = await search(viewer, word('footfall'));
    expect(text.body.results).toHaveLength(1);
    expect(text.body.results[0].place).toEqual({
      revision: { id: revisionId, number: 1 },
      blockId: 'intro',
      blockIndex: 1,
      blockKind: 'text',
      line: 2,
      text: `The ${word('footfall')} rate is assumed.`,
    });
  });

  it('finds a sheet by its exact number, though its tokens are too short to index', async () => {
    const res = await search(viewer, sheetNumber);
    expect(res.body.results.map((r: { sheet: { id: number } }) => r.sheet.id)).toContain(sheetId);
    const hit = res.body.results.find((r: { sheet: { id: number } }) => r.sheet.id === sheetId);
    expect(hit.fields).toContain('number');
  });

  it('finds remark text and reply text with their revision, block and line', async () => {
    const remark = await search(viewer, word('elastomer'));
    expect(remark.body.results).toEqual([
      {
        kind: 'remark',
        project: {
          id: team.project.id,
          jobNumber: team.project.jobNumber,
          name: team.project.name,
        },
        sheet: { id: sheetId, number: sheetNumber, title: `Deck ${word('quaywobble')} check` },
        revision: { id: revisionId, number: 1 },
        remarkId,
        blockId: 'masses',
        line: 2,
        text: `Is the ${word('elastomer')} stiffness from the supplier?`,
      },
    ]);
    const reply = await search(viewer, word('datasheet'));
    expect(reply.body.results).toHaveLength(1);
    expect(reply.body.results[0]).toMatchObject({ kind: 'reply', remarkId, line: 2 });
  });

  it('needs every word: two words of one sheet find it, a word of nowhere else finds nothing', async () => {
    const both = await search(viewer, `${word('quaywobble')} ${word('footfall')}`);
    expect(both.body.results).toHaveLength(1);
    const none = await search(viewer, `${word('quaywobble')} ${word('nowhere')}`);
    expect(none.body.results).toEqual([]);
  });

  it('lists the words it leaves out (too short, or too common to be indexed)', async () => {
    const res = await search(viewer, `k1 the ${word('footfall')}`);
    expect(res.body.words).toEqual([word('footfall')]);
    expect(res.body.skipped).toEqual([
      { word: 'k1', reason: 'short' },
      { word: 'the', reason: 'common' },
    ]);
    expect(res.body.results).toHaveLength(1);
  });

  it('treats boolean-mode operators as plain text', async () => {
    const res = await search(viewer, `-${word('footfall')} +"(*`);
    expect(res.status).toBe(200);
    expect(res.body.results).toHaveLength(1);
  });

  it('finds nothing for a person who is not a member of the project', async () => {
    for (const q of [word('quaywobble'), word('elastomer'), word('datasheet'), sheetNumber]) {
      const res = await search(outsider, q);
      expect(res.status).toBe(200);
      expect(res.body.results).toEqual([]);
    }
  });

  it('shows a viewer only the projects she is a member of', async () => {
    // The same words in a second project she does not belong to.
    const other = await createProject(t.db);
    const otherAuthor = await createUser(t.db);
    await addMember(t.db, other.id, otherAuthor.id, ['author']);
    const client = await signedIn(t.app, otherAuthor);
    const made = await createSheetWithDraft(
      client,
      other.id,
      { number: `SR2-${tag}`, title: `Other ${word('quaywobble')}` },
      [{ id: 'intro', kind: 'text', source: 'Nothing here.' }],
    );
    const mine = await search(viewer, word('quaywobble'));
    expect(mine.body.results.map((r: { sheet: { id: number } }) => r.sheet.id)).toEqual([sheetId]);
    const theirs = await search(client, word('quaywobble'));
    expect(theirs.body.results.map((r: { sheet: { id: number } }) => r.sheet.id)).toEqual([
      made.id,
    ]);
    // An admin opens every project, so finds both.
    const all = await search(admin, word('quaywobble'));
    expect(all.body.results.map((r: { sheet: { id: number } }) => r.sheet.id).sort()).toEqual(
      [sheetId, made.id].sort(),
    );
  });

  it('follows a draft as it is saved', async () => {
    const before = await search(author, word('retrofit'));
    expect(before.body.results).toEqual([]);
    const current = (await author.get(`/api/sheets/${sheetId}`)).body.sheet;
    const res = await author.agent
      .put(`/api/sheets/${sheetId}/draft`)
      .set('X-CSRF-Token', author.csrfToken)
      .set('If-Match', `"${current.draftVersion}"`)
      .send({
        blocks: [
          ...current.draft.blocks,
          { id: 'later', kind: 'text', source: `A ${word('retrofit')} note.` },
        ],
        settings: current.draft.settings,
      });
    expect(res.status).toBe(200);
    const after = await search(author, word('retrofit'));
    expect(after.body.results[0].place).toMatchObject({ blockId: 'later', blockIndex: 3, line: 1 });
    // Only in the unissued draft: not the viewer's to find, by text or by place.
    const viewers = await search(viewer, word('retrofit'));
    expect(viewers.status).toBe(200);
    expect(viewers.body.results).toEqual([]);
    // The title is hers to read; the draft's line is not, so the result has no place.
    const byTitle = await search(viewer, `${word('quaywobble')} ${word('retrofit')}`);
    expect(byTitle.body.results).toEqual([]);
  });

  it('uses the full-text index rather than reading every row', async () => {
    const [rows] = (await t.db.raw(
      'EXPLAIN SELECT id FROM sheets s WHERE MATCH (s.number, s.title, s.subject, s.draft_text) AGAINST (? IN BOOLEAN MODE)',
      [`+${word('quaywobble')}*`],
    )) as [{ type: string; key: string | null }[]];
    expect(rows[0]).toMatchObject({ type: 'fulltext', key: 'sheets_search_fulltext' });
  });
});
