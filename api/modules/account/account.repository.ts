import type { DbOrTx } from '../../db/index';

export const accountRepository = {
  async passwordHashOf(db: DbOrTx, userId: number): Promise<string | undefined> {
    const row = (await db('users').where({ id: userId }).first('password_hash')) as
      { password_hash: string } | undefined;
    return row?.password_hash;
  },

  async setPasswordHash(db: DbOrTx, userId: number, hash: string): Promise<void> {
    await db('users')
      .where({ id: userId })
      .update({ password_hash: hash, updated_at: db.fn.now(3) });
  },
};
