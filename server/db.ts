import { Sequelize } from 'sequelize';
import { Umzug, SequelizeStorage } from 'umzug';
import { pathToFileURL, fileURLToPath } from 'node:url';
import path from 'node:path';

const here = path.dirname(fileURLToPath(import.meta.url));

/**
 * How long the app waits on PostgreSQL before it gives up and answers 503 with Retry-After
 * (server/middleware/error-handler.ts) instead of hanging: a new connection, a free pooled
 * connection, and one statement. A stopped or restarting database refuses at once, so those
 * answers come in milliseconds; these bounds are for one that stops answering without refusing.
 * They are not tighter because a burst of sign-ins (bcrypt on the event loop) can delay a healthy
 * connection's handshake by a few seconds on a busy machine, and that must not turn into a 503.
 * Shared by Sequelize, the session store's pool and the cache bus.
 */
export const DB_TIMEOUTS = {
  connectMs: 5000,
  acquireMs: 5000,
  // long enough for the heaviest Debrief query on a big group; a stuck one frees its connection
  statementMs: 60_000,
} as const;

/** node-postgres settings for every connection the app opens (Sequelize's and the session store's). */
export const pgClientTimeouts = {
  connectionTimeoutMillis: DB_TIMEOUTS.connectMs,
  statement_timeout: DB_TIMEOUTS.statementMs,
  // the client's own limit, for a server that stopped answering without closing the connection
  query_timeout: DB_TIMEOUTS.statementMs + 5000,
  keepAlive: true,
};

/** `name` shows as application_name in pg_stat_activity (the replica's pool is told apart by it). */
export function createSequelize(databaseUrl: string, opts: { logging?: boolean; pool?: number; name?: string; connectTimeoutMs?: number } = {}): Sequelize {
  return new Sequelize(databaseUrl, {
    dialect: 'postgres',
    logging: opts.logging ? (sql) => console.log(sql) : false,
    pool: { max: opts.pool ?? 10, min: 0, idle: 10_000, acquire: DB_TIMEOUTS.acquireMs },
    dialectOptions: {
      ...pgClientTimeouts, application_name: opts.name ?? 'sparkwright',
      connectionTimeoutMillis: opts.connectTimeoutMs ?? pgClientTimeouts.connectionTimeoutMillis,
    },
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
