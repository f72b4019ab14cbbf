/** What the cache needs of a better-sqlite3 connection. */
type Preparing = { prepare(sql: string): unknown };

/** How many prepared statements one connection keeps: the app's queries and then some. */
const DEFAULT_LIMIT = 500;

/**
 * Knex's better-sqlite3 dialect prepares every query anew, and compiling SQL cost about a tenth of
 * the request thread under load. The connection keeps its prepared statements by their SQL (the
 * least recently used go past `limit`: `where id in (?, ?, …)` makes a text per list length).
 * Reusing one is safe because knex runs each with `all` or `run`, which finish before they return,
 * and SQLite prepares a kept statement again by itself when a migration changes the schema.
 */
export function keepPreparedStatements<T extends Preparing>(connection: T, limit = DEFAULT_LIMIT): T {
  const prepare = connection.prepare.bind(connection);
  const kept = new Map<string, unknown>();
  connection.prepare = (sql: string) => {
    const known = kept.get(sql);
    if (known !== undefined) {
      // Most recently used last, so the first key is the one to drop.
      kept.delete(sql);
      kept.set(sql, known);
      return known;
    }
    const statement = prepare(sql);
    kept.set(sql, statement);
    if (kept.size > limit) kept.delete(kept.keys().next().value!);
    return statement;
  };
  return connection;
}
