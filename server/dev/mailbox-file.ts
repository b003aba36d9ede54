import { readFileSync } from 'node:fs';
import path from 'node:path';
import type { ReceivedMail } from './fake-smtp';

/**
 * The mail a fake receiver in another process (npm run cluster's shared fakes) kept in
 * `dir`/mail.jsonl, so that every app server shows the same mailbox. No dev packages here: the
 * production start may load it.
 */
export function readMailbox(dir: string): ReceivedMail[] {
  let text: string;
  try { text = readFileSync(path.join(dir, 'mail.jsonl'), 'utf8'); } catch { return []; }
  return text.split('\n').filter((l) => l.trim()).map((l) => JSON.parse(l) as ReceivedMail);
}
