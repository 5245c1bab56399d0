import createKnex, { type Knex } from 'knex';

/** Sets the clock of the seed's one connection to `days` before today (UTC) at `time` ("HH:MM"). */
export type SetDemoClock = (days: number, time: string) => Promise<void>;

/**
 * Runs a seed on one connection of its own whose clock tells the scenario's time: MariaDB's
 * session `timestamp` is what NOW(), the column defaults and the services' `dbNow` read, so the
 * demo's history reads as the weeks of work DESIGN §11 tells, not as the minute of the seeding.
 * Times are relative to the day of the seeding, so the demo always looks recent; every step is in
 * the past. Sealed revisions and seals are signed with the times they were made at, as in use.
 */
export async function withDemoClock<T>(
  knex: Knex,
  run: (db: Knex, at: SetDemoClock) => Promise<T>,
): Promise<T> {
  const db = createKnex({ ...(knex.client.config as Knex.Config), pool: { min: 1, max: 1 } });
  const today = new Date();
  today.setUTCHours(0, 0, 0, 0);
  const at: SetDemoClock = async (days, time) => {
    const match = /^(\d\d):(\d\d)$/.exec(time);
    if (!match || days < 1) throw new Error(`demo clock: ${days} day(s) before today at ${time}`);
    const when = today.getTime() - days * 86_400_000 + (+match[1]! * 60 + +match[2]!) * 60_000;
    await db.raw('SET timestamp = ?', [when / 1000]);
  };
  try {
    return await run(db, at);
  } finally {
    await db.destroy();
  }
}
