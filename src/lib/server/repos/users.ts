import type { Knex } from 'knex';
import { db } from '../db';
import { ConflictError, NotFoundError } from '../http';

export type User = { id: number; email: string; name: string; createdAt: string };

type UserRow = { id: number; email: string; name: string; password_hash: string; created_at: string; updated_at: string };

function rowToUser(row: UserRow): User {
  return { id: row.id, email: row.email, name: row.name, createdAt: row.created_at };
}

export async function findUserById(id: number, trx: Knex = db()): Promise<User | undefined> {
  const row = await trx<UserRow>('users').where({ id }).first();
  return row && rowToUser(row);
}

export async function getUserById(id: number, trx: Knex = db()): Promise<User> {
  const user = await findUserById(id, trx);
  if (!user) throw new NotFoundError('user');
  return user;
}

/** The user and their password hash, for checking a sign-in only. */
export async function findCredentials(email: string, trx: Knex = db()): Promise<{ user: User; passwordHash: string } | undefined> {
  const row = await trx<UserRow>('users').where({ email: email.trim().toLowerCase() }).first();
  return row && { user: rowToUser(row), passwordHash: row.password_hash };
}

/** @throws ConflictError when the e-mail is taken */
export async function createUser(
  input: { email: string; name: string; passwordHash: string },
  trx: Knex = db(),
): Promise<User> {
  const email = input.email.trim().toLowerCase();
  const now = new Date().toISOString();
  const existing = await trx('users').where({ email }).first('id');
  if (existing) {
    throw new ConflictError('An account with this e-mail address already exists. Sign in instead.', {
      email: 'This e-mail address already has an account.',
    });
  }
  const [row] = await trx<UserRow>('users')
    .insert({ email, name: input.name.trim(), password_hash: input.passwordHash, created_at: now, updated_at: now })
    .returning('*');
  return rowToUser(row as UserRow);
}
