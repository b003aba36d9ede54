import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { startTestApp, signInAs, otherShopMember, expectEnvelope, type TestEnv, type Client } from './harness';
import { publishBenchProcedure, startBody, stepBody, storedObjectCount, TINY_PNG, type BenchWorld } from './bench-fixtures';
import { Attachment } from '../../server/models';
import { MAX_PHOTO_BYTES } from '../../server/services/attachment.service';

let env: TestEnv;
let tech: Client;
let world: BenchWorld;
let diagnosisId: string;

beforeAll(async () => {
  env = await startTestApp();
  world = await publishBenchProcedure();
  tech = await signInAs(env.app, 'tech');
  const body = startBody(world);
  await tech.post('/api/diagnoses', body).expect(201);
  diagnosisId = body.id;
});
afterAll(async () => env?.close());

function upload(photo: { bytes: Buffer; name: string }, fields: Record<string, string> = {}, thumb?: { bytes: Buffer; name: string }) {
  const req = tech.agent.post('/api/attachments').set('X-CSRF-Token', tech.csrf)
    .field('id', fields.id ?? randomUUID()).field('diagnosisId', fields.diagnosisId ?? diagnosisId);
  if (fields.stepId) req.field('stepId', fields.stepId);
  req.attach('photo', photo.bytes, { filename: photo.name, contentType: 'image/jpeg' });
  if (thumb) req.attach('thumb', thumb.bytes, { filename: thumb.name, contentType: 'image/jpeg' });
  return req;
}

/**
 * Hand-written multipart, because the usual form encoders cut a path off the file name before
 * sending and would hide what a hostile client can send.
 */
function rawUpload(filename: string, bytes: Buffer) {
  const boundary = '----sparkwright-test-boundary';
  const part = (headers: string, body: Buffer | string) => Buffer.concat([Buffer.from(`--${boundary}\r\n${headers}\r\n\r\n`), Buffer.from(body), Buffer.from('\r\n')]);
  const body = Buffer.concat([
    part('Content-Disposition: form-data; name="id"', randomUUID()),
    part('Content-Disposition: form-data; name="diagnosisId"', diagnosisId),
    part(`Content-Disposition: form-data; name="photo"; filename="${filename.replace(/\\/g, '\\\\')}"\r\nContent-Type: image/png`, bytes),
    Buffer.from(`--${boundary}--\r\n`),
  ]);
  return tech.agent.post('/api/attachments').set('X-CSRF-Token', tech.csrf)
    .set('Content-Type', `multipart/form-data; boundary=${boundary}`).send(body);
}

describe('photos of a diagnosis', () => {
  it('stores a photo and its thumbnail once in object storage and serves them back', async () => {
    const before = storedObjectCount(env);
    const id = randomUUID();
    const res = await upload({ bytes: TINY_PNG, name: 'plug.png' }, { id, stepId: 'sparkTest' }, { bytes: TINY_PNG, name: 'plug-thumb.png' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ id, contentType: 'image/png', hasThumb: true, stepId: 'sparkTest' });
    const again = await upload({ bytes: TINY_PNG, name: 'plug.png' }, { id, stepId: 'sparkTest' });
    expect(again.status).toBe(200);
    expect(storedObjectCount(env)).toBe(before + 2);
    const back = await tech.get(`/api/attachments/${id}/thumb`).buffer(true).expect(200);
    expect(Buffer.compare(back.body as Buffer, TINY_PNG)).toBe(0);
  });

  it('refuses a document renamed .jpg by its bytes, and stores nothing', async () => {
    const rows = await Attachment.count();
    const objects = storedObjectCount(env);
    const res = await upload({ bytes: Buffer.from('%PDF-1.4\n1 0 obj << >> endobj\n'), name: 'photo.jpg' });
    expect(res.status).toBe(415);
    expect(expectEnvelope(res.body).message).toMatch(/not a JPEG, PNG or WebP/);
    expect(await Attachment.count()).toBe(rows);
    expect(storedObjectCount(env)).toBe(objects);
  });

  it('refuses an oversize file, and stores nothing', async () => {
    const rows = await Attachment.count();
    const objects = storedObjectCount(env);
    const big = Buffer.concat([TINY_PNG, Buffer.alloc(MAX_PHOTO_BYTES + 1)]);
    const res = await upload({ bytes: big, name: 'big.png' });
    expect(res.status).toBe(413);
    expectEnvelope(res.body);
    expect(await Attachment.count()).toBe(rows);
    expect(storedObjectCount(env)).toBe(objects);
  });

  it('refuses a file name with a path in it, and stores nothing', async () => {
    const rows = await Attachment.count();
    const objects = storedObjectCount(env);
    for (const name of ['../../etc/passwd.png', 'photos/plug.png', 'C:\\temp\\plug.png']) {
      const res = await rawUpload(name, TINY_PNG);
      expect(res.status, name).toBe(400);
      expect(expectEnvelope(res.body).message).toMatch(/folder path/);
    }
    expect(await Attachment.count()).toBe(rows);
    expect(storedObjectCount(env)).toBe(objects);
  });

  // A tiny JPEG by its markers only (SOI, a comment, EOI): enough for the byte check to call it a JPEG.
  const jpegWith = (inside: string) => Buffer.concat([Buffer.from([0xff, 0xd8, 0xff, 0xfe, 0x00, 0x10]), Buffer.from(inside), Buffer.from([0xff, 0xd9])]);
  const HOSTILE: { what: string; name: string; bytes: Buffer; status: number; message: RegExp; asThumb?: boolean }[] = [
    { what: 'a text file renamed .jpg', name: 'plug.jpg', bytes: Buffer.from('Plug gap 0.6 mm, cap 5k\n'), status: 415, message: /not a JPEG, PNG or WebP/ },
    { what: 'an SVG with a script', name: 'plug.svg', bytes: Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>'), status: 415, message: /not a JPEG, PNG or WebP/ },
    { what: 'an SVG renamed .png', name: 'plug.png', bytes: Buffer.from('<?xml version="1.0"?><svg xmlns="http://www.w3.org/2000/svg" onload="alert(1)"/>'), status: 415, message: /not a JPEG, PNG or WebP/ },
    { what: 'an HTML page', name: 'plug.html', bytes: Buffer.from('<!doctype html><html><body><script>fetch("/api/shop/members")</script></body></html>'), status: 415, message: /not a JPEG, PNG or WebP/ },
    { what: 'a JPEG that is also a web page (polyglot)', name: 'plug.jpg', bytes: jpegWith('<html><script>alert(1)</script></html>'), status: 415, message: /holds more than a picture/ },
    { what: 'a PNG with a script after its end (polyglot)', name: 'plug.png', bytes: Buffer.concat([TINY_PNG, Buffer.from('<script>alert(1)</script>')]), status: 415, message: /holds more than a picture/ },
    { what: 'a PNG with an archive after its end', name: 'plug.png', bytes: Buffer.concat([TINY_PNG, Buffer.from('PK\x03\x04hidden.class')]), status: 415, message: /holds more than a picture/ },
    { what: 'a polyglot sent as the thumbnail of a good photo', name: 'thumb.jpg', bytes: jpegWith('<svg onload=alert(1)>'), status: 415, message: /thumbnail holds more than a picture/, asThumb: true },
    { what: 'an oversize file', name: 'big.png', bytes: Buffer.concat([TINY_PNG, Buffer.alloc(MAX_PHOTO_BYTES + 1)]), status: 413, message: /too large.*8 MB/ },
    { what: '../ in the name', name: '../../photo.png', bytes: TINY_PNG, status: 400, message: /folder path/ },
  ];

  it.each(HOSTILE)('refuses $what with a clear message, and nothing reaches the store or the attachments table', async ({ name, bytes, status, message, asThumb }) => {
    const rows = await Attachment.count();
    const objects = storedObjectCount(env);
    const res = asThumb
      ? await upload({ bytes: TINY_PNG, name: 'photo.png' }, {}, { bytes, name })
      : name.includes('/') ? await rawUpload(name, bytes) : await upload({ bytes, name });
    expect(res.status).toBe(status);
    expect(expectEnvelope(res.body).message).toMatch(message);
    expect(await Attachment.count()).toBe(rows);
    expect(storedObjectCount(env)).toBe(objects);
  });

  it('a member of another shop cannot add or read photos of this diagnosis (404)', async () => {
    const [a] = await Attachment.findAll({ limit: 1 });
    const other = await otherShopMember(env, ['technician']);
    expect((await other.get(`/api/attachments/${a!.id}`)).status).toBe(404);
    const res = await other.agent.post('/api/attachments').set('X-CSRF-Token', other.csrf)
      .field('id', randomUUID()).field('diagnosisId', diagnosisId).attach('photo', TINY_PNG, 'x.png');
    expect(res.status).toBe(404);
  });
});

describe('the e-mailed report', () => {
  it('arrives at the service desk with the readings, verdicts, finding, parts and photo thumbnails', async () => {
    const post = (stepId: string, after: string | null, extra = {}) => tech.post(`/api/diagnoses/${diagnosisId}/steps`, stepBody(stepId, after, extra));
    const a = (await post('killLead', null).expect(201)).body;
    const b = (await post('sparkTest', a.id, { answerId: 'none' }).expect(201)).body;
    const c = (await post('exciter', b.id, { entered: '2.1k' }).expect(201)).body;
    expect(c.verdict).toBe('above');
    await post('coilFinding', c.id, { outcome: { partsFitted: [{ name: 'Stator', lot: 'S-4471' }], finalCheck: { spark: true, runs: true, stops: true }, labourMinutes: 50 } }).expect(201);
    const res = await tech.post(`/api/diagnoses/${diagnosisId}/report`, {}).expect(200);
    expect(res.body.sentTo).toBe('desk@larkspur.test');
    const mail = await env.smtp.waitFor((m) => m.subject.startsWith('Diagnosis report') && m.to.includes('desk@larkspur.test'));
    expect(mail.text).toContain('2.1k');
    expect(mail.text).toContain('above limits');
    expect(mail.text).toContain('Stator (lot S-4471)');
    expect(mail.text).toMatch(/manufacturer's service data/);
    // the receiver's parser inlines cid: pictures, so the thumbnail shows up as an <img> and an attachment
    expect(mail.html).toMatch(/<img[^>]+alt="Photo"/);
    expect(mail.attachments.some((x) => x.contentType === 'image/png')).toBe(true);
    expect(mail.attachments.length).toBeGreaterThanOrEqual(1);
  });
});
