import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SMTPServer, type SMTPServerDataStream, type SMTPServerSession } from 'smtp-server';
import { createMailer } from '../../api/mail/mailer';
import { blockLabel } from '../../api/modules/revisions/review-mail';
import {
  createSheetWithDraft,
  anonymous,
  createTeamApp,
  type ApiClient,
  type TestApp,
} from '../support/api-app';
import { createProjectTeam, unique } from '../support/factories';

// Mail to whoever must act next: with no MW_SMTP_URL every message lands in the
// outbox table. Checkers on issue, the author on a remark and on return, principals on sign off,
// every member on seal.

let t: TestApp;
let team: Awaited<ReturnType<typeof createProjectTeam>>;
let author: ApiClient;
let checker: ApiClient;
let principal: ApiClient;
let admin: ApiClient;
let sheetId: number;

interface Message {
  to: string[];
  subject: string;
  text: string;
  relatedSheetId: number | null;
}

async function messages(): Promise<Message[]> {
  const res = await admin.get(`/api/outbox?sheetId=${sheetId}`);
  expect(res.status).toBe(200);
  return res.body.messages;
}

beforeAll(async () => {
  delete process.env.MW_SMTP_URL;
  ({
    t,
    team,
    clients: { author, checker, principal, admin },
  } = await createTeamApp(['author', 'checker', 'principal', 'admin']));
  sheetId = (
    await createSheetWithDraft(
      author,
      team.project.id,
      { number: `OB-${unique()}`, title: 'Mail check' },
      [{ id: 'calc', kind: 'calc', source: 'k = 24 kN/mm\nm = 18 t\nf = sqrt(k/m)/(2 pi)' }],
    )
  ).id;
});

afterAll(async () => {
  await t?.close();
});

describe('mail on each transition (outbox transport)', () => {
  it('leaves the right message for the right people at every step', async () => {
    const rev1 = await author.post(`/api/sheets/${sheetId}/revisions`, { purpose: 'For check' });
    expect(rev1.status).toBe(201);
    let box = await messages();
    expect(box).toHaveLength(1);
    expect(box[0]).toMatchObject({ to: [team.checker.email], relatedSheetId: sheetId });
    expect(box[0]!.subject).toMatch(/Rev 1 issued for check/);

    const remark = await checker.post(`/api/revisions/${rev1.body.revision.id}/remarks`, {
      blockId: 'calc',
      line: 2,
      type: 'query',
      text: 'Mass source?',
    });
    expect(remark.status).toBe(201);
    box = await messages();
    expect(box[0]).toMatchObject({ to: [team.author.email] });
    expect(box[0]!.subject).toMatch(/new query remark/);
    expect(box[0]!.text).toContain('block 1 (calc, calc), line 2');

    await checker.post(`/api/revisions/${rev1.body.revision.id}/return`);
    box = await messages();
    expect(box[0]).toMatchObject({ to: [team.author.email] });
    expect(box[0]!.subject).toMatch(/Rev 1 returned/);

    const rev2 = await author.post(`/api/sheets/${sheetId}/revisions`, { purpose: 'For check' });
    expect(rev2.status).toBe(201);
    box = await messages();
    expect(box[0]!.subject).toMatch(/Rev 2 issued for check/);
    expect(box[0]!.text).toMatch(/1 remark\(s\) carried over/);
    const carried = await checker.get(`/api/revisions/${rev2.body.revision.id}/remarks`);
    await checker.patch(`/api/remarks/${carried.body.remarks[0].id}`, { state: 'closed' });
    await checker.post(`/api/revisions/${rev2.body.revision.id}/sign-off`);
    box = await messages();
    expect(box[0]).toMatchObject({ to: [team.principal.email] });
    expect(box[0]!.subject).toMatch(/Rev 2 signed off/);

    const sealed = await principal.post(`/api/revisions/${rev2.body.revision.id}/seal`, {
      password: team.principal.password,
    });
    expect(sealed.status).toBe(200);
    box = await messages();
    expect(box[0]!.subject).toContain(sealed.body.seal.code);
    expect([...box[0]!.to].sort()).toEqual(
      [team.author.email, team.checker.email, team.principal.email, team.viewer.email].sort(),
    );
    expect(box).toHaveLength(6);
    // Every message carries the caution of DESIGN §12.
    for (const m of box) expect(m.text).toMatch(/verified by a qualified engineer/);
  });
});

describe('GET /api/outbox', () => {
  it('gives an administrator all mail and everyone else only the mail sent to them', async () => {
    expect((await (await anonymous(t.app)).get('/api/outbox')).status).toBe(401);
    const all = await admin.get(`/api/outbox?sheetId=${sheetId}`);
    expect(all.body.scope).toBe('all');
    expect(all.body.messages).toHaveLength(6);
    // Each names the sheet and its project, so the reader can open it.
    for (const m of all.body.messages) {
      expect(m).toMatchObject({ relatedSheetId: sheetId, relatedProjectId: team.project.id });
    }
    // The author was written to on the remark, the return and the seal (the test above).
    for (const [client, email, count] of [
      [author, team.author.email, 3],
      [checker, team.checker.email, 3],
      [principal, team.principal.email, 2],
    ] as const) {
      const res = await client.get(`/api/outbox?sheetId=${sheetId}`);
      expect(res.status).toBe(200);
      expect(res.body.scope).toBe('mine');
      expect(res.body.messages).toHaveLength(count);
      for (const m of res.body.messages as Message[]) {
        expect(m.to.map((a) => a.toLowerCase())).toContain(email.toLowerCase());
      }
    }
  });

  it('refuses a bad filter naming the field', async () => {
    const res = await admin.get('/api/outbox?sheetId=abc');
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('sheetId');
  });
});

describe('createMailer with MW_SMTP_URL', () => {
  it('delivers over SMTP instead of the outbox when a server is configured', async () => {
    const received: { from: string; to: string[]; data: string }[] = [];
    const server = new SMTPServer({
      authOptional: true,
      disabledCommands: ['STARTTLS'],
      onData(stream: SMTPServerDataStream, session: SMTPServerSession, callback: () => void) {
        let data = '';
        stream.on('data', (c: Buffer) => (data += c.toString('utf8')));
        stream.on('end', () => {
          received.push({
            from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
            to: session.envelope.rcptTo.map((r) => r.address),
            data,
          });
          callback();
        });
      },
    });
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    const port = (server.server.address() as AddressInfo).port;
    const before = Number((await t.db('outbox').count({ n: '*' }).first())?.n);
    const mailer = createMailer({
      store: () => Promise.reject(new Error('SMTP mode stores nothing')),
      smtpUrl: `smtp://127.0.0.1:${port}`,
    });
    try {
      expect(mailer.mode).toBe('smtp');
      await mailer.send({
        to: ['checker@smtp.example'],
        subject: 'Rev 3 issued for check',
        text: 'Please check it.',
        kind: 'revision.issued',
        relatedSheetId: null,
      });
    } finally {
      mailer.close();
      await new Promise<void>((resolve) => server.close(resolve));
    }
    expect(received).toHaveLength(1);
    expect(received[0]!.to).toEqual(['checker@smtp.example']);
    expect(received[0]!.data).toContain('Subject: Rev 3 issued for check');
    expect(received[0]!.data).toContain('X-Modewright-Kind: revision.issued');
    const after = Number((await t.db('outbox').count({ n: '*' }).first())?.n);
    expect(after).toBe(before);
  });
});

describe('blockLabel (how a mail names a block)', () => {
  it('names a block by place and kind, with the id only when the author named it', () => {
    const blocks = [
      { id: 'storeys', kind: 'calc' },
      { id: 'b1a2b3c4d5e6f', kind: 'modes' },
      { id: 'b0123456789ab', kind: 'modes' },
    ];
    expect(blockLabel(blocks, 'storeys')).toBe('block 1 (calc, storeys)');
    // b + 12 hex digits is the editor's generated id: meaningless to a reader
    expect(blockLabel(blocks, 'b0123456789ab')).toBe('block 3 (modes)');
    expect(blockLabel(blocks, 'gone')).toBe('block gone');
  });
});
