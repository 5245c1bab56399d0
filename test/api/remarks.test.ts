import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  createSheetWithDraft,
  anonymous,
  createTeamApp,
  type ApiClient,
  type TestApp,
} from '../support/api-app';
import { createProjectTeam, unique } from '../support/factories';

// Remarks (server side): a checker remarks on a line, the author answers by
// replying, the checker closes; roles, states and the line checked against the frozen block.

let t: TestApp;
let team: Awaited<ReturnType<typeof createProjectTeam>>;
let author: ApiClient;
let checker: ApiClient;
let principal: ApiClient;
let viewer: ApiClient;
let outsider: ApiClient;

async function revisionInCheck(): Promise<number> {
  const sheet = await createSheetWithDraft(
    author,
    team.project.id,
    { number: `RM-${unique()}`, title: 'Remarks' },
    [{ id: 'calc', kind: 'calc', source: 'k = 24 kN/mm\nm = 18 t\nf = sqrt(k/m)/(2 pi)' }],
  );
  const rev = await author.post(`/api/sheets/${sheet.id}/revisions`, {
    purpose: 'For check',
  });
  expect(rev.status).toBe(201);
  return rev.body.revision.id;
}

const remarkOn = (revId: number, body: Record<string, unknown>) =>
  checker.post(`/api/revisions/${revId}/remarks`, body);

beforeAll(async () => {
  ({
    t,
    team,
    clients: { author, checker, principal, viewer, outsider },
  } = await createTeamApp(['author', 'checker', 'principal', 'viewer', 'outsider']));
});

afterAll(async () => {
  await t?.close();
});

describe('POST /api/revisions/:revisionId/remarks', () => {
  it('anchors a checker’s remark to a block and line and records it', async () => {
    const revId = await revisionInCheck();
    const res = await remarkOn(revId, {
      blockId: 'calc',
      line: 3,
      type: 'error',
      text: 'Units of f?',
    });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.remark).toMatchObject({
      revisionId: revId,
      blockId: 'calc',
      line: 3,
      type: 'error',
      text: 'Units of f?',
      state: 'open',
      carriedFrom: null,
      lineChanged: false,
      author: { id: team.checker.id, name: team.checker.name },
      replies: [],
    });
    const row = await t.db('remarks').where({ id: res.body.remark.id }).first();
    expect(row).toMatchObject({
      revision_id: revId,
      block_id: 'calc',
      line: 3,
      author_id: team.checker.id,
    });
    const activity = await t
      .db('activity')
      .where({ action: 'remark.added', object_id: res.body.remark.id });
    expect(activity).toHaveLength(1);
    const list = await viewer.get(`/api/revisions/${revId}/remarks`);
    expect(list.status).toBe(200);
    expect(list.body.remarks.map((r: { id: number }) => r.id)).toEqual([res.body.remark.id]);
  });

  it('refuses the author, the principal, a viewer, an outsider and a signed-out caller', async () => {
    const revId = await revisionInCheck();
    const body = { blockId: 'calc', line: 1, type: 'query', text: 'Why?' };
    for (const client of [author, principal, viewer, outsider]) {
      expect((await client.post(`/api/revisions/${revId}/remarks`, body)).status).toBe(403);
    }
    expect(
      (await (await anonymous(t.app)).post(`/api/revisions/${revId}/remarks`, body)).status,
    ).toBe(401);
    expect((await outsider.get(`/api/revisions/${revId}/remarks`)).status).toBe(403);
  });

  it('refuses a line past the end of the block, an unknown block and an unknown type', async () => {
    const revId = await revisionInCheck();
    const past = await remarkOn(revId, { blockId: 'calc', line: 4, type: 'query', text: 'x' });
    expect(past.status).toBe(422);
    expect(past.body.error.field).toBe('line');
    expect(past.body.error.message).toMatch(/has 3 line\(s\); there is no line 4/);
    const block = await remarkOn(revId, { blockId: 'nope', line: 1, type: 'query', text: 'x' });
    expect(block.status).toBe(422);
    expect(block.body.error.field).toBe('blockId');
    const type = await remarkOn(revId, { blockId: 'calc', line: 1, type: 'opinion', text: 'x' });
    expect(type.status).toBe(422);
    expect(type.body.error.field).toBe('type');
  });

  it('refuses remarks on a revision that is no longer in check', async () => {
    const revId = await revisionInCheck();
    await checker.post(`/api/revisions/${revId}/return`);
    const res = await remarkOn(revId, { blockId: 'calc', line: 1, type: 'query', text: 'Late.' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('REVISION_NOT_IN_CHECK');
  });
});

describe('POST /api/remarks/:remarkId/replies and PATCH /api/remarks/:remarkId', () => {
  it('lets the author answer and the checker close, in a thread', async () => {
    const revId = await revisionInCheck();
    const made = await remarkOn(revId, { blockId: 'calc', line: 2, type: 'query', text: 'Mass?' });
    const id = made.body.remark.id;
    const answer = await author.post(`/api/remarks/${id}/replies`, { text: 'Includes finishes.' });
    expect(answer.status).toBe(201);
    expect(answer.body.remark.state).toBe('answered');
    expect(answer.body.remark.replies).toMatchObject([
      { text: 'Includes finishes.', author: { id: team.author.id } },
    ]);
    const follow = await checker.post(`/api/remarks/${id}/replies`, { text: 'Thanks.' });
    expect(follow.body.remark.state).toBe('answered');
    expect(follow.body.remark.replies).toHaveLength(2);

    const closed = await checker.patch(`/api/remarks/${id}`, { state: 'closed' });
    expect(closed.status).toBe(200);
    expect(closed.body.remark).toMatchObject({
      state: 'closed',
      closedBy: { id: team.checker.id },
    });
    const reopened = await checker.patch(`/api/remarks/${id}`, { state: 'open' });
    expect(reopened.body.remark).toMatchObject({ state: 'open', closedBy: null });
    const actions = (await t.db('activity').where({ object_type: 'remark', object_id: id })).map(
      (a: { action: string }) => a.action,
    );
    expect(actions.sort()).toEqual(
      [
        'remark.added',
        'remark.closed',
        'remark.reopened',
        'remark.replied',
        'remark.replied',
      ].sort(),
    );
  });

  it('refuses replies from a viewer or the principal, and state changes from the author', async () => {
    const revId = await revisionInCheck();
    const made = await remarkOn(revId, {
      blockId: 'calc',
      line: 1,
      type: 'editorial',
      text: 'Spacing.',
    });
    const id = made.body.remark.id;
    expect((await viewer.post(`/api/remarks/${id}/replies`, { text: 'Hi' })).status).toBe(403);
    expect((await principal.post(`/api/remarks/${id}/replies`, { text: 'Hi' })).status).toBe(403);
    expect((await author.patch(`/api/remarks/${id}`, { state: 'closed' })).status).toBe(403);
    const answered = await checker.patch(`/api/remarks/${id}`, { state: 'answered' });
    expect(answered.status).toBe(422);
    expect(answered.body.error.field).toBe('state');
    const empty = await author.post(`/api/remarks/${id}/replies`, { text: '   ' });
    expect(empty.status).toBe(422);
    expect(empty.body.error.field).toBe('text');
    expect((await checker.patch('/api/remarks/999999999', { state: 'closed' })).status).toBe(404);
  });

  it('refuses closing a remark once the revision is returned', async () => {
    const revId = await revisionInCheck();
    const made = await remarkOn(revId, {
      blockId: 'calc',
      line: 1,
      type: 'query',
      text: 'Source?',
    });
    await checker.post(`/api/revisions/${revId}/return`);
    const res = await checker.patch(`/api/remarks/${made.body.remark.id}`, { state: 'closed' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('REVISION_NOT_IN_CHECK');
    // The author still answers a returned revision's remarks.
    const reply = await author.post(`/api/remarks/${made.body.remark.id}/replies`, {
      text: 'From run 14.',
    });
    expect(reply.status).toBe(201);
    expect(reply.body.remark.state).toBe('answered');
  });
});

describe('PATCH and DELETE /api/remarks/:remarkId/replies/:replyId', () => {
  async function answered() {
    const revId = await revisionInCheck();
    const remark = await remarkOn(revId, {
      blockId: 'calc',
      line: 2,
      type: 'query',
      text: 'Is 18 t the whole storey?',
    });
    const reply = await author.post(`/api/remarks/${remark.body.remark.id}/replies`, {
      text: 'Yes, finishes included.',
    });
    expect(reply.status).toBe(201);
    expect(reply.body.remark.state).toBe('answered');
    return {
      revId,
      remarkId: remark.body.remark.id as number,
      replyId: reply.body.remark.replies[0].id as number,
    };
  }

  it('lets the writer edit a reply nobody has acted on, marked edited and logged with the old text', async () => {
    const { remarkId, replyId } = await answered();
    const res = await author.patch(`/api/remarks/${remarkId}/replies/${replyId}`, {
      text: 'Yes, finishes and services included (18 t).',
    });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.remark.replies[0]).toMatchObject({
      id: replyId,
      text: 'Yes, finishes and services included (18 t).',
    });
    expect(res.body.remark.replies[0].editedAt).not.toBeNull();
    const log = await t
      .db('activity')
      .where({ action: 'remark.reply_edited', object_id: remarkId })
      .first();
    expect(log.details).toMatchObject({
      replyId,
      text: 'Yes, finishes included.',
    });
  });

  it('lets the writer withdraw the reply, which opens the remark again, on a returned revision too', async () => {
    const { revId, remarkId, replyId } = await answered();
    expect((await checker.post(`/api/revisions/${revId}/return`)).status).toBe(200);
    const res = await author.delete(`/api/remarks/${remarkId}/replies/${replyId}`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.remark).toMatchObject({ state: 'open', replies: [] });
    expect(await t.db('remark_replies').where({ id: replyId })).toHaveLength(0);
    const log = await t
      .db('activity')
      .where({ action: 'remark.reply_withdrawn', object_id: remarkId })
      .first();
    expect(log.details).toMatchObject({ text: 'Yes, finishes included.' });
  });

  it('refuses someone else’s reply, and a reply the checker has answered or closed', async () => {
    const { remarkId, replyId } = await answered();
    const other = await checker.patch(`/api/remarks/${remarkId}/replies/${replyId}`, {
      text: 'Changed by the checker',
    });
    expect(other.status).toBe(403);
    expect(other.body.error.code).toBe('NOT_YOUR_REPLY');
    await checker.post(`/api/remarks/${remarkId}/replies`, { text: 'And the services?' });
    const after = await author.delete(`/api/remarks/${remarkId}/replies/${replyId}`);
    expect(after.status).toBe(409);
    expect(after.body.error.code).toBe('REPLY_SETTLED');
    expect(after.body.error.message).toMatch(/someone has replied after it/);

    const second = await answered();
    await checker.patch(`/api/remarks/${second.remarkId}`, { state: 'closed' });
    const closed = await author.patch(`/api/remarks/${second.remarkId}/replies/${second.replyId}`, {
      text: 'Late edit',
    });
    expect(closed.status).toBe(409);
    expect(closed.body.error.message).toMatch(/closed the remark/);
  });

  it('refuses a viewer, an outsider, a signed-out caller, an empty text and an unknown reply', async () => {
    const { remarkId, replyId } = await answered();
    const url = `/api/remarks/${remarkId}/replies/${replyId}`;
    for (const client of [viewer, principal, outsider]) {
      expect((await client.patch(url, { text: 'x' })).status).toBe(403);
      expect((await client.delete(url)).status).toBe(403);
    }
    expect((await (await anonymous(t.app)).delete(url)).status).toBe(401);
    const empty = await author.patch(url, { text: '  ' });
    expect(empty.status).toBe(422);
    expect(empty.body.error.field).toBe('text');
    const missing = await author.delete(`/api/remarks/${remarkId}/replies/999999999`);
    expect(missing.status).toBe(404);
    const badId = await author.delete(`/api/remarks/${remarkId}/replies/first`);
    expect(badId.status).toBe(422);
    expect(badId.body.error.field).toBe('replyId');
  });
});
