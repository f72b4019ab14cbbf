import type { Knex } from 'knex';

type MigrationModule = { up: (knex: Knex) => Promise<void>; down: (knex: Knex) => Promise<void> };

/**
 * A knex migration source over modules already loaded, keyed by file name. The same list serves
 * the built server (Vite bundles `migrations/*.ts` through `import.meta.glob`), vitest, and the
 * `db:*` scripts (which load the folder with tsx), so every path records the same names.
 */
export function migrationSource(modules: Record<string, MigrationModule>): Knex.MigrationSource<string> {
  const byName = new Map(Object.entries(modules).map(([file, module]) => [baseName(file), module]));
  return {
    getMigrations: async () => [...byName.keys()].sort(),
    getMigrationName: (name) => name,
    getMigration: async (name) => {
      const module = byName.get(name);
      if (!module) throw new Error(`Migration ${name} is missing from this build`);
      return module;
    },
  };
}

/** Migrations compiled into this build. */
export function bundledMigrations(): Knex.MigrationSource<string> {
  return migrationSource(import.meta.glob<MigrationModule>('../../../migrations/*.ts', { eager: true }));
}

function baseName(file: string): string {
  return file.slice(file.lastIndexOf('/') + 1);
}
