import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';
import { appendFile, mkdir, readFile } from 'node:fs/promises';
import path from 'node:path';
import type { AddressInfo } from 'node:net';

export interface ReceivedMail {
  id: number;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string;
  attachments: { filename: string; contentType: string; size: number }[];
}

export interface FakeSmtp {
  port: number;
  messages(): ReceivedMail[];
  /** resolves with the first message (already received or arriving within timeoutMs) that matches */
  waitFor(match: (m: ReceivedMail) => boolean, timeoutMs?: number): Promise<ReceivedMail>;
  close(): Promise<void>;
}

/**
 * A local stand-in for the shop's mail server: accepts every message on loopback, keeps it in
 * memory and, when given a folder, appends it to mail.jsonl so that the mail page survives restarts.
 */
export async function startFakeSmtp(opts: { port?: number; dir?: string } = {}): Promise<FakeSmtp> {
  const store: ReceivedMail[] = [];
  const waiters: { match: (m: ReceivedMail) => boolean; resolve: (m: ReceivedMail) => void }[] = [];
  const file = opts.dir ? path.join(opts.dir, 'mail.jsonl') : null;
  if (file) {
    await mkdir(opts.dir!, { recursive: true });
    const old = await readFile(file, 'utf8').catch(() => '');
    for (const line of old.split('\n')) if (line.trim()) store.push(JSON.parse(line) as ReceivedMail);
  }
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then(async (parsed) => {
          const mail: ReceivedMail = {
            id: store.length + 1,
            receivedAt: new Date().toISOString(),
            from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
            to: session.envelope.rcptTo.map((r) => r.address),
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : '',
            attachments: parsed.attachments.map((a) => ({ filename: a.filename ?? '', contentType: a.contentType, size: a.size })),
          };
          store.push(mail);
          if (file) await appendFile(file, JSON.stringify(mail) + '\n');
          for (const w of [...waiters]) if (w.match(mail)) { waiters.splice(waiters.indexOf(w), 1); w.resolve(mail); }
          callback();
        })
        .catch((err: Error) => callback(err));
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port ?? 0, '127.0.0.1', () => resolve());
  });
  const port = (server.server.address() as AddressInfo).port;
  return {
    port,
    messages: () => [...store],
    waitFor(match, timeoutMs = 5000) {
      const found = store.find(match);
      if (found) return Promise.resolve(found);
      return new Promise((resolve, reject) => {
        const w = { match, resolve };
        waiters.push(w);
        setTimeout(() => { if (waiters.includes(w)) { waiters.splice(waiters.indexOf(w), 1); reject(new Error('no matching mail arrived')); } }, timeoutMs);
      });
    },
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

