import Database from 'better-sqlite3';
import { describe, expect, it } from 'vitest';
import { keepPreparedStatements } from '../../../src/lib/server/kept-statements';

describe('keepPreparedStatements', () => {
  it('hands back the statement already prepared for the same SQL', () => {
    const connection = keepPreparedStatements(new Database(':memory:'));
    connection.exec('create table fences (id integer primary key, name text)');
    const first = connection.prepare('select * from fences where id = ?');
    expect(connection.prepare('select * from fences where id = ?')).toBe(first);
    expect(connection.prepare('select name from fences where id = ?')).not.toBe(first);
    connection.close();
  });

  it('drops the least recently used statement past its limit', () => {
    const connection = keepPreparedStatements(new Database(':memory:'), 2);
    const one = connection.prepare('select 1');
    const two = connection.prepare('select 2');
    expect(connection.prepare('select 1')).toBe(one); // "select 2" is now the oldest
    connection.prepare('select 3');
    expect(connection.prepare('select 1')).toBe(one);
    expect(connection.prepare('select 2')).not.toBe(two);
    connection.close();
  });

  it('sees a column added after the statement was prepared (SQLite prepares it again)', () => {
    const connection = keepPreparedStatements(new Database(':memory:'));
    connection.exec("create table fences (id integer primary key, name text); insert into fences (name) values ('North boundary')");
    expect(connection.prepare('select * from fences').all()).toEqual([{ id: 1, name: 'North boundary' }]);
    connection.exec("alter table fences add column status text not null default 'planned'");
    expect(connection.prepare('select * from fences').all()).toEqual([{ id: 1, name: 'North boundary', status: 'planned' }]);
    connection.close();
  });
});
