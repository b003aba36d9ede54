import path from 'node:path';
import type { Config } from './config';
import type { AppDeps } from './deps';
import { createSequelize, createMigrator } from './db';
import { createMailer } from './services/mailer';
import { createObjectStore } from './services/storage';
import type { FakeSmtp } from './dev/fake-smtp';
import type { FakeS3 } from './dev/fake-s3';
import { initModels } from './models';
import { startCacheBus } from './lib/cache-bus';
import { startReadReplica } from './lib/read-replica';
import { readMailbox } from './dev/mailbox-file';

export interface Runtime { deps: AppDeps; fakes: { smtp: FakeSmtp | null; s3: FakeS3 | null }; close(): Promise<void> }

const log = (msg: string, err?: unknown) => {
  console.error(`[sparkwright] ${msg}`);
  if (err) console.error(err);
};

/**
 * Opens the database, starts the local fake mail and object stores when asked to, and builds
 * the dependencies of the app. The process entry and the test helpers share it.
 */
export async function startRuntime(config: Config, opts: { migrate?: boolean } = {}): Promise<Runtime> {
  const sequelize = createSequelize(config.DATABASE_URL);
  await sequelize.authenticate();
  initModels(sequelize);
  if (opts.migrate) {
    const done = await createMigrator(sequelize).up();
    if (done.length) log(`applied ${done.length} migration(s): ${done.map((m) => m.name).join(', ')}`);
  }
  let smtp: FakeSmtp | null = null;
  let s3: FakeS3 | null = null;
  let smtpPort = config.SMTP_PORT;
  let s3Endpoint = config.S3_ENDPOINT;
  if (config.LOCAL_FAKES) {
    // Loaded only when asked for: the fakes' packages are dev dependencies, absent in production.
    const [{ startFakeSmtp }, { startFakeS3 }] = await Promise.all([import('./dev/fake-smtp'), import('./dev/fake-s3')]);
    smtp = await startFakeSmtp({ port: config.SMTP_PORT, dir: path.join(config.DATA_DIR, 'mail') });
    smtpPort = smtp.port;
    s3 = await startFakeS3({ dir: path.join(config.DATA_DIR, 's3'), bucket: config.S3_BUCKET });
    s3Endpoint = s3.endpoint;
  }
  const mailer = createMailer({ host: config.SMTP_HOST, port: smtpPort, from: config.MAIL_FROM });
  const store = createObjectStore({
    endpoint: s3Endpoint, bucket: config.S3_BUCKET, region: config.S3_REGION,
    accessKeyId: config.S3_ACCESS_KEY, secretAccessKey: config.S3_SECRET_KEY,
  });
  await store.ensureBucket();
  const mailbox = smtp ?? (config.MAILBOX_DIR ? { messages: () => readMailbox(config.MAILBOX_DIR) } : null);
  const reads = config.DATABASE_REPLICA_URL
    ? startReadReplica({
      primary: sequelize, maxLagSeconds: config.REPLICA_MAX_LAG_SECONDS, log,
      replica: createSequelize(config.DATABASE_REPLICA_URL, { pool: 5, name: 'sparkwright-debrief-reads', connectTimeoutMs: 2000 }),
    })
    : null;
  const deps: AppDeps = { config, sequelize, reads, mailer, store, mailbox, log };
  const stopCacheBus = await startCacheBus(config.DATABASE_URL, log);
  return {
    deps,
    fakes: { smtp, s3 },
    async close() {
      await stopCacheBus();
      await reads?.close();
      mailer.close();
      await smtp?.close();
      await s3?.close();
      await sequelize.close();
    },
  };
}
