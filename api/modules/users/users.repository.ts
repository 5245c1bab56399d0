import type { DbOrTx } from '../../db/index';

/** A person as the API shows them: never a password or hash. */
export interface User {
  id: number;
  email: string;
  name: string;
  isAdmin: boolean;
  licenceNumber: string | null;
  jurisdiction: string | null;
}

interface UserRow {
  id: number;
  email: string;
  name: string;
  password_hash: string;
  is_admin: number | boolean;
  licence_number: string | null;
  jurisdiction: string | null;
}

const publicColumns = ['id', 'email', 'name', 'is_admin', 'licence_number', 'jurisdiction'];

type PublicRow = Omit<UserRow, 'password_hash'>;

function toUser(row: PublicRow): User {
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    isAdmin: Boolean(row.is_admin),
    licenceNumber: row.licence_number,
    jurisdiction: row.jurisdiction,
  };
}

export interface NewUser {
  email: string;
  name: string;
  passwordHash: string;
  isAdmin: boolean;
  licenceNumber: string | null;
  jurisdiction: string | null;
}

export const usersRepository = {
  async findById(db: DbOrTx, id: number): Promise<User | undefined> {
    const row: PublicRow | undefined = await db('users')
      .select(publicColumns)
      .where({ id })
      .first();
    return row ? toUser(row) : undefined;
  },

  async findByEmail(db: DbOrTx, email: string): Promise<User | undefined> {
    const row: PublicRow | undefined = await db('users')
      .select(publicColumns)
      .where({ email })
      .first();
    return row ? toUser(row) : undefined;
  },

  /** The one place a hash is read: for checking a password, never for a response. */
  async findCredentials(
    db: DbOrTx,
    email: string,
  ): Promise<{ user: User; passwordHash: string } | undefined> {
    const row = await db<UserRow>('users').where({ email }).first();
    if (!row) return undefined;
    const { password_hash: passwordHash, ...rest } = row;
    return { user: toUser(rest), passwordHash };
  },

  async list(db: DbOrTx): Promise<User[]> {
    const rows: PublicRow[] = await db('users').select(publicColumns).orderBy('name').orderBy('id');
    return rows.map(toUser);
  },

  async insert(db: DbOrTx, user: NewUser): Promise<number> {
    const [id] = await db('users').insert({
      email: user.email,
      name: user.name,
      password_hash: user.passwordHash,
      is_admin: user.isAdmin,
      licence_number: user.licenceNumber,
      jurisdiction: user.jurisdiction,
    });
    if (id === undefined) throw new Error('users insert returned no id');
    return id;
  },

  /** The stored password hash, read only to check a password typed again. */
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
