import { Sequelize } from 'sequelize';
import { Umzug, SequelizeStorage } from 'umzug';
import { pathToFileURL, fileURLToPath } from 'node:url';
import path from 'node:path';

const here = path.dirname(fileURLToPath(import.meta.url));

export function createSequelize(databaseUrl: string, opts: { logging?: boolean; pool?: number } = {}): Sequelize {
  return new Sequelize(databaseUrl, {
    dialect: 'postgres',
    logging: opts.logging ? (sql) => console.log(sql) : false,
    pool: { max: opts.pool ?? 10, min: 0, idle: 10_000 },
    define: { underscored: true },
  });
}

type MigrationFn = (ctx: { context: ReturnType<Sequelize['getQueryInterface']> }) => Promise<void>;

/**
 * umzug over server/migrations/*.ts (or the compiled *.js of dist-server/); ESM needs each file
 * loaded with import(fileURL). A migration keeps its source name (.ts) either way, so a database
 * migrated by `npm start` and one migrated by the compiled server agree on what has run.
 */
export function createMigrator(sequelize: Sequelize) {
  return new Umzug({
    migrations: {
      glob: ['migrations/*.{ts,js}', { cwd: here, ignore: ['**/*.d.ts'] }],
      resolve: ({ name, path: file, context }) => ({
        name: name.replace(/\.js$/, '.ts'),
        up: async () => {
          const mod = (await import(pathToFileURL(file!).href)) as { up: MigrationFn };
          return mod.up({ context });
        },
        down: async () => {
          const mod = (await import(pathToFileURL(file!).href)) as { down?: MigrationFn };
          if (mod.down) await mod.down({ context });
        },
      }),
    },
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: undefined,
  });
}
