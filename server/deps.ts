import type { Sequelize } from 'sequelize';
import type { Config } from './config';
import type { Mailer } from './services/mailer';
import type { ObjectStore } from './services/storage';
import type { ReceivedMail } from './dev/fake-smtp';
import type { ReadReplica } from './lib/read-replica';

/** Everything a route or service needs from the outside world; tests build their own. */
export interface AppDeps {
  config: Config;
  sequelize: Sequelize;
  /** the streaming replica for Debrief reads (DATABASE_REPLICA_URL); null without one */
  reads: ReadReplica | null;
  mailer: Mailer;
  store: ObjectStore;
  /** the local fake receiver's mailbox, shown to admins in development; null in production */
  mailbox: { messages(): ReceivedMail[] } | null;
  log: (msg: string, err?: unknown) => void;
}
