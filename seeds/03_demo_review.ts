import type { Knex } from 'knex';
import { createAppContext } from '../api/app-context';
import { loadConfig } from '../api/config/index';
import type { AppContext } from '../api/http/context';
import type { Logger } from '../api/http/logger';
import { remarksService } from '../api/modules/remarks/remarks.service';
import {
  remarkRevisionAccess,
  revisionAccess,
  revisionsService,
} from '../api/modules/revisions/revisions.service';
import { sealsService } from '../api/modules/seals/seals.service';
import { findSheetById, type SheetBlock } from '../api/modules/sheets/sheets.repository';
import { sheetsService } from '../api/modules/sheets/sheets.service';
import { usersRepository, type User } from '../api/modules/users/users.repository';
import { DEMO_PASSWORD } from './01_demo_scenario';
import { withDemoClock, type SetDemoClock } from './support/demo-clock';

// The review stages of DESIGN §11, produced through the review services so that canonical texts,
// digests, remark carry-over and the seal's signature are all real:
//   DYN-01 footbridge       Rev 1 returned with a remark, Rev 2 signed off and sealed by Priya
//   DYN-02 four-storey frame Rev 1 in check with an open remark
//   DYN-03 pump foundation  still a draft
// Each step at its day and time (seeds/support/demo-clock.ts): DYN-01 over the second and third
// weeks before today, DYN-02 in the last few days. Safe to re-run: a sheet that already has a
// revision is left as it is. Mail goes wherever the app's mail goes (the outbox table when
// MW_SMTP_URL is unset), like any other transition.

const quietLog: Logger = {
  info() {},
  error(message, error) {
    process.stderr.write(`seed 03: ${message} ${error instanceof Error ? error.message : ''}\n`);
  },
};

/** The revision in scope for a checker's remark, as the route asks the access policy for it. */
function asChecker(ctx: AppContext, user: User, revisionId: number) {
  return revisionAccess(ctx, user, revisionId, 'remark.add');
}

async function person(knex: Knex, email: string): Promise<User> {
  const user = await usersRepository.findByEmail(knex, email);
  if (!user) throw new Error(`seeds/03_demo_review needs ${email} from seeds/01.`);
  return user;
}

function lineStarting(blocks: SheetBlock[], blockId: string, prefix: string): number {
  const block = blocks.find((b) => b.id === blockId);
  const i = block ? block.source.split('\n').findIndex((l) => l.startsWith(prefix)) : -1;
  if (i < 0) throw new Error(`seed 03: block ${blockId} has no line starting "${prefix}"`);
  return i + 1;
}

async function sheetByNumber(knex: Knex, projectId: number, number: string) {
  const row = (await knex('sheets').where({ project_id: projectId, number }).first('id')) as
    { id: number } | undefined;
  if (!row) throw new Error(`seed 03: sheet ${number} is missing; run seeds/02 first.`);
  const sheet = await findSheetById(knex, row.id);
  if (!sheet) throw new Error(`seed 03: sheet ${number} is missing.`);
  const revisions = (await knex('revisions')
    .where({ sheet_id: row.id })
    .count({ n: '*' })
    .first()) as { n: number | string } | undefined;
  return { sheet, issued: Number(revisions?.n ?? 0) > 0 };
}

export async function seed(knex: Knex): Promise<void> {
  await withDemoClock(knex, (db, at) => review(db, at));
}

async function review(knex: Knex, at: SetDemoClock): Promise<void> {
  const project = (await knex('projects').where({ job_number: 'BW-2611' }).first('id')) as
    { id: number } | undefined;
  if (!project) throw new Error('seeds/03_demo_review needs project BW-2611 from seeds/01.');
  const [ines, tomasz, priya] = await Promise.all([
    person(knex, 'ines.marlow@brackwater.example'),
    person(knex, 'tomasz.reyes@brackwater.example'),
    person(knex, 'priya.anand@brackwater.example'),
  ]);
  const deps = createAppContext({ db: knex, config: loadConfig(), log: quietLog });
  try {
    await footbridge(knex, deps, at, project.id, { ines, tomasz, priya });
    await frame(knex, deps, at, project.id, { ines, tomasz });
  } finally {
    deps.mailer.close();
  }
}

async function footbridge(
  knex: Knex,
  deps: AppContext,
  at: SetDemoClock,
  projectId: number,
  p: { ines: User; tomasz: User; priya: User },
): Promise<void> {
  const { sheet, issued } = await sheetByNumber(knex, projectId, 'DYN-01');
  if (issued) return;
  await at(14, '16:40');
  const rev1 = await revisionsService.issue(deps, p.ines, sheet.id, 'For check');
  await at(13, '10:05');
  const massLine = lineStarting(sheet.draft.blocks, 'deck-data', 'm = ');
  const remark = await remarksService.create(
    deps,
    p.tomasz,
    await asChecker(deps, p.tomasz, rev1.id),
    {
      blockId: 'deck-data',
      line: massLine,
      type: 'query',
      text:
        'The 0.15 t/m for parapets and services looks light: the lighting conduits and the ' +
        'handrail heating cable are on drawing KQ-E-402. Please confirm the allowance.',
    },
  );
  await at(13, '10:12');
  await revisionsService.returnRevision(deps, p.tomasz, rev1.id);
  await at(12, '09:30');
  await remarksService.reply(
    deps,
    p.ines,
    await remarkRevisionAccess(deps, p.ines, remark.id, 'remark.reply'),
    remark.id,
    'Agreed: services are 0.20 t/m with the conduits and heating cable. Mass revised and the ' +
      'source of each part noted above the line.',
  );

  // Rev 2: the mass revised and a note added below it, so the remark carries over to the edited
  // line and is flagged "line changed" for Tomasz to look at.
  const current = await findSheetById(knex, sheet.id);
  if (!current) throw new Error('seed 03: DYN-01 vanished');
  const blocks = current.draft.blocks.map((b) => {
    if (b.id !== 'deck-data') return b;
    const lines = b.source.split('\n');
    const i = lines.findIndex((l) => l.startsWith('m = '));
    lines.splice(
      i,
      1,
      'm = 2.90 t/m  # steel 1.35, slab 1.10, surfacing 0.25, parapets and services 0.20',
      '# services 0.20 t/m incl. lighting conduits and handrail heating (KQ-E-402)',
    );
    return { ...b, source: lines.join('\n') };
  });
  await at(12, '09:48');
  await sheetsService.saveDraft(deps, p.ines, sheet.id, current.draftVersion, {
    blocks,
    settings: current.draft.settings,
  });
  await at(12, '10:02');
  const rev2 = await revisionsService.issue(
    deps,
    p.ines,
    sheet.id,
    'For construction — services mass revised after check',
  );
  await at(11, '14:20');
  const rev2Scope = await revisionAccess(deps, p.tomasz, rev2.id, 'remark.set_state');
  const carried = await remarksService.list(deps, rev2Scope);
  for (const r of carried) {
    const scope = await remarkRevisionAccess(deps, p.tomasz, r.id, 'remark.reply');
    await remarksService.reply(deps, p.tomasz, scope, r.id, 'Checked against KQ-E-402: agreed.');
    await remarksService.setState(deps, p.tomasz, scope, r.id, 'closed');
  }
  await at(11, '14:26');
  await revisionsService.signOff(deps, p.tomasz, rev2.id);
  await at(10, '09:15');
  const sealScope = await revisionAccess(deps, p.priya, rev2.id, 'revision.seal');
  await sealsService.seal(deps, p.priya, sealScope, {
    password: DEMO_PASSWORD,
    purpose: null,
  });

  // After the seal the client asks for the comfort check itself: Ines adds the walking
  // acceleration to the draft, for Rev 3 (the sealed Rev 2 stays as it is).
  const sealed = await findSheetById(knex, sheet.id);
  if (!sealed) throw new Error('seed 03: DYN-01 vanished');
  const outcomeAt = sealed.draft.blocks.findIndex((b) => b.id === 'outcome');
  const walking: SheetBlock[] = [
    {
      id: 'walking',
      kind: 'response',
      source: [
        'modes: deck_v',
        'analysis: walking',
        'mode: 1',
        'force: 0.41 kN  # P_o for footbridges (AISC Design Guide 11, from memory)',
        'damping: 0.005  # welded steel box girder, no finishes (common practice)',
        'limit: 0.7 meter/s^2  # EN 1990 A2 §A2.4.3.2, vertical, normal use (from memory); m is the mass per length here',
        'name: walk',
      ].join('\n'),
    },
    {
      id: 'walking-criteria',
      kind: 'criteria',
      source:
        'walk.a <= walk.limit  # vertical deck acceleration under one walker (EN 1990 A2 §A2.4.3.2, from memory)',
    },
  ];
  const next = [...sealed.draft.blocks];
  next.splice(outcomeAt < 0 ? next.length : outcomeAt, 0, ...walking);
  await at(9, '11:20');
  await sheetsService.saveDraft(deps, p.ines, sheet.id, sealed.draftVersion, {
    blocks: next,
    settings: sealed.draft.settings,
  });
}

async function frame(
  knex: Knex,
  deps: AppContext,
  at: SetDemoClock,
  projectId: number,
  p: { ines: User; tomasz: User },
): Promise<void> {
  const { sheet, issued } = await sheetByNumber(knex, projectId, 'DYN-02');
  if (issued) return;
  await at(3, '17:10');
  const rev1 = await revisionsService.issue(deps, p.ines, sheet.id, 'For check');
  await at(2, '11:30');
  await remarksService.create(deps, p.tomasz, await asChecker(deps, p.tomasz, rev1.id), {
    blockId: 'storeys',
    line: lineStarting(sheet.draft.blocks, 'storeys', 'k_4 = '),
    type: 'error',
    text:
      'The roof storey stiffness drops 22 % from storey 3, but the bracing does not change on ' +
      'the elevations. Please take k_4 from the frame model, not the hand estimate.',
  });
}
