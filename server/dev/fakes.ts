import path from 'node:path';
import { startFakeSmtp } from './fake-smtp';
import { startFakeS3 } from './fake-s3';

// The local fakes as a process of their own, for npm run cluster: every app server sends its mail
// to this one receiver and keeps its photos in this one store, and reads the mailbox from
// DATA_DIR/mail (MAILBOX_DIR), so all of them see the same mail and photos.
// Settings: DATA_DIR, SMTP_PORT, S3_PORT, S3_BUCKET.
const dataDir = process.env.DATA_DIR ?? '.data';
const smtp = await startFakeSmtp({ port: Number(process.env.SMTP_PORT ?? 0), dir: path.join(dataDir, 'mail') });
const s3 = await startFakeS3({ dir: path.join(dataDir, 's3'), bucket: process.env.S3_BUCKET ?? 'sparkwright-photos', port: Number(process.env.S3_PORT ?? 0) });
console.log(`[fakes] mail receiver on 127.0.0.1:${smtp.port}, object store at ${s3.endpoint}`);
const stop = () => { void Promise.all([smtp.close(), s3.close()]).finally(() => process.exit(0)); };
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
