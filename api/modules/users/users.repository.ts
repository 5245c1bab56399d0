import type { DbOrTx } from '../../db/index';
import type { ManagedUser, User } from '../../../core/contract/people';

// A person as the API shows them (never a password or hash), and as the admin screen lists them:
// the shapes are the contract's.
export type { ManagedUser, User };

interface UserRow {
  id: number;
  email: string;
  name: string;
  password_hash: string;
  is_admin: number | boolean;
  licence_number: string | null;
  jurisdiction: string | null;
  deactivated_at: Date | null;
}

const publicColumns = ['id', 'email', 'name', 'is_admin', 'licence_number', 'jurisdiction'];
const managedColumns = [...publicColumns, 'deactivated_at'];

type PublicRow = Omit<UserRow, 'password_hash' | 'deactivated_at'>;
type ManagedRow = Omit<UserRow, 'password_hash'>;

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

function toManagedUser(row: ManagedRow): ManagedUser {
  return {
    ...toUser(row),
    deactivatedAt: row.deactivated_at ? new Date(row.deactivated_at).toISOString() : null,
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

export interface UserChanges {
  email?: string;
  name?: string;
  licenceNumber?: string | null;
  jurisdiction?: string | null;
}

export interface NewPasswordReset {
  userId: number;
  tokenHash: string;
  createdBy: number;
  expiresAt: Date;
}

export interface PasswordReset {
  id: number;
  userId: number;
  expiresAt: Date;
  usedAt: Date | null;
}

export const usersRepository = {
  async findById(db: DbOrTx, id: number): Promise<User | undefined> {
    const row: PublicRow | undefined = await db('users')
      .select(publicColumns)
      .where({ id })
      .first();
    return row ? toUser(row) : undefined;
  },

  /** The person a session names, only while they are active (a deactivated person is nobody). */
  async findActiveById(db: DbOrTx, id: number): Promise<User | undefined> {
    const row: PublicRow | undefined = await db('users')
      .select(publicColumns)
      .where({ id })
      .whereNull('deactivated_at')
      .first();
    return row ? toUser(row) : undefined;
  },

  async findManagedById(db: DbOrTx, id: number): Promise<ManagedUser | undefined> {
    const row: ManagedRow | undefined = await db('users')
      .select(managedColumns)
      .where({ id })
      .first();
    return row ? toManagedUser(row) : undefined;
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
  ): Promise<{ user: User; passwordHash: string; deactivated: boolean } | undefined> {
    const row = await db<UserRow>('users').where({ email }).first();
    if (!row) return undefined;
    const { password_hash: passwordHash, deactivated_at: deactivatedAt, ...rest } = row;
    return { user: toUser(rest), passwordHash, deactivated: deactivatedAt !== null };
  },

  async list(db: DbOrTx): Promise<ManagedUser[]> {
    const rows: ManagedRow[] = await db('users')
      .select(managedColumns)
      .orderBy('name')
      .orderBy('id');
    return rows.map(toManagedUser);
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

  async update(db: DbOrTx, id: number, changes: UserChanges): Promise<void> {
    const values: Record<string, unknown> = {};
    if (changes.email !== undefined) values.email = changes.email;
    if (changes.name !== undefined) values.name = changes.name;
    if (changes.licenceNumber !== undefined) values.licence_number = changes.licenceNumber;
    if (changes.jurisdiction !== undefined) values.jurisdiction = changes.jurisdiction;
    if (Object.keys(values).length === 0) return;
    await db('users')
      .where({ id })
      .update({ ...values, updated_at: db.fn.now(3) });
  },

  async setDeactivated(db: DbOrTx, id: number, deactivated: boolean): Promise<void> {
    await db('users')
      .where({ id })
      .update({ deactivated_at: deactivated ? db.fn.now(3) : null, updated_at: db.fn.now(3) });
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

  async insertPasswordReset(db: DbOrTx, reset: NewPasswordReset): Promise<number> {
    const [id] = await db('password_resets').insert({
      user_id: reset.userId,
      token_hash: reset.tokenHash,
      created_by: reset.createdBy,
      expires_at: reset.expiresAt,
    });
    if (id === undefined) throw new Error('password_resets insert returned no id');
    return id;
  },

  /** Locks the reset row (FOR UPDATE) so two uses of one link cannot both pass. */
  async findPasswordResetForUpdate(
    db: DbOrTx,
    tokenHash: string,
  ): Promise<PasswordReset | undefined> {
    const row = (await db('password_resets')
      .where({ token_hash: tokenHash })
      .forUpdate()
      .first('id', 'user_id', 'expires_at', 'used_at')) as
      { id: number; user_id: number; expires_at: Date; used_at: Date | null } | undefined;
    return row
      ? { id: row.id, userId: row.user_id, expiresAt: row.expires_at, usedAt: row.used_at }
      : undefined;
  },

  async markPasswordResetUsed(db: DbOrTx, id: number): Promise<void> {
    await db('password_resets')
      .where({ id })
      .update({ used_at: db.fn.now(3) });
  },

  /** An earlier unused link stops working when a new one is sent. */
  async retireOpenPasswordResets(db: DbOrTx, userId: number): Promise<void> {
    await db('password_resets')
      .where({ user_id: userId })
      .whereNull('used_at')
      .update({ expires_at: db.fn.now(3) });
  },
};
