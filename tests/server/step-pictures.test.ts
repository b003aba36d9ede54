import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import sharp from 'sharp';
import { PNG } from 'pngjs';
import type { ProcedureDocument } from '@shared/schema';
import { startTestApp, signInAs, otherShopMember, expectEnvelope, type TestEnv, type Client } from './harness';
import { storedObjectCount, TINY_PNG } from './bench-fixtures';
import { doc, finding, observation, ohmsReading } from '../shared/fixtures';
import { MAX_PHOTO_BYTES } from '../../server/services/image-check';
import { randomUUID } from 'node:crypto';
import { Diagnosis, Procedure, User, Vehicle } from '../../server/models';
import { readPicture, sweepUnnamedPictures } from '../../server/services/step-picture.service';

let env: TestEnv;
let author: Client;
let lead: Client;
let tech: Client;

beforeAll(async () => {
  env = await startTestApp();
  [author, lead, tech] = await Promise.all([signInAs(env.app, 'author'), signInAs(env.app, 'lead'), signInAs(env.app, 'tech')]);
});
afterAll(async () => env?.close());

/** A 40 × 30 PNG drawn pixel by pixel with pngjs (not by the library under test), a stripe to tell the sides apart. */
function stripedPng(): Buffer {
  const png = new PNG({ width: 40, height: 30 });
  for (let i = 0; i < 40 * 30; i++) {
    const x = i % 40;
    png.data.set(x < 10 ? [200, 30, 30, 255] : [240, 240, 240, 255], i * 4);
  }
  return PNG.sync.write(png);
}
/** A large camera-like JPEG and a WebP, to see the renditions shrink (made with sharp, which only encodes them here). */
const bigJpeg = () => sharp({ create: { width: 2400, height: 1600, channels: 3, background: '#3a6ea5' } }).jpeg({ quality: 85 }).toBuffer();
const smallWebp = () => sharp({ create: { width: 64, height: 48, channels: 3, background: '#e0a030' } }).webp().toBuffer();

const META = { title: 'Pulser check', symptom: 'No spark at the plug', ignitionSystem: 'magneto-cdi' as const };
function soundDocument(title: string): ProcedureDocument {
  const d = doc([
    ohmsReading('pulser', 80, 200, { low: 'shorted', ok: 'sparkSeen', high: 'openCoil' }),
    observation('sparkSeen', { yes: 'openCoil', no: 'shorted' }),
    finding('shorted'),
    finding('openCoil'),
  ]);
  return { ...d, meta: { ...d.meta, ...META, title } };
}

type Ids = { procedureId: string; draftId: string };
const url = (ids: Ids, tail = '') => `/api/procedures/${ids.procedureId}/versions/${ids.draftId}${tail}`;

async function createDraft(title: string): Promise<Ids & { lock: number }> {
  const ids = (await author.post('/api/procedures', { meta: { ...META, title } }).expect(201)).body as Ids;
  const saved = await author.put(url(ids), { document: soundDocument(title), lockVersion: 1 }).expect(200);
  return { ...ids, lock: saved.body.lockVersion as number };
}

function upload(c: Client, ids: Ids, bytes: Buffer, name: string, stepId = 'pulser') {
  return c.agent.post(url(ids, '/pictures')).set('X-CSRF-Token', c.csrf).field('stepId', stepId)
    .attach('picture', bytes, { filename: name, contentType: 'image/png' });
}

async function pictureRows(): Promise<number> {
  const [row] = await env.runtime.deps.sequelize.query<{ n: string }>('SELECT count(*) AS n FROM step_pictures', { type: QueryTypes.SELECT });
  return Number(row!.n);
}

/** Adds pictures to the `pulser` step of a draft and saves it; returns the saved document. */
async function attach(ids: Ids & { lock: number }, pictures: { id: string; caption: string }[]): Promise<ProcedureDocument> {
  const current = (await author.get(url(ids)).expect(200)).body as { document: ProcedureDocument; lockVersion: number };
  const document = { ...current.document, steps: current.document.steps.map((s) => (s.id === 'pulser' ? { ...s, pictures } : s)) };
  const res = await author.put(url(ids), { document, lockVersion: current.lockVersion });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body.document as ProcedureDocument;
}

async function publish(ids: Ids): Promise<void> {
  await author.post(url(ids, '/submit')).expect(200);
  await lead.post(url(ids, '/publish')).expect(200);
}

describe('uploading a reference picture to a step', () => {
  it('accepts a PNG, a JPEG and a WebP by their bytes, and stores the original, a thumbnail and a phone rendition', async () => {
    const ids = await createDraft('Three kinds');
    const before = storedObjectCount(env);
    for (const [bytes, name, mime] of [[stripedPng(), 'pins.png', 'image/png'], [await bigJpeg(), 'stator.jpg', 'image/jpeg'], [await smallWebp(), 'spark.webp', 'image/webp']] as const) {
      const res = await upload(author, ids, bytes, name);
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      expect(res.body).toMatchObject({ contentType: mime, byteSize: bytes.length });
    }
    expect(storedObjectCount(env)).toBe(before + 9);
  });

  it('makes the thumbnail at most 320 px and the phone rendition at most 1280 px on the longer side, as WebP, keeping the shape', async () => {
    const ids = await createDraft('Sizes');
    const res = await upload(author, ids, await bigJpeg(), 'stator.jpg').expect(201);
    expect(res.body).toMatchObject({ width: 2400, height: 1600 });
    const id = res.body.id as string;
    const phone = await sharp((await author.get(`/api/pictures/${id}/phone`).buffer(true).expect(200)).body as Buffer).metadata();
    const thumb = await sharp((await author.get(`/api/pictures/${id}/thumb`).buffer(true).expect(200)).body as Buffer).metadata();
    expect([phone.format, phone.width, phone.height]).toEqual(['webp', 1280, 853]);
    expect([thumb.format, thumb.width, thumb.height]).toEqual(['webp', 320, 213]);
    const full = await author.get(`/api/pictures/${id}/full`).buffer(true).expect(200);
    expect(full.headers['content-type']).toBe('image/jpeg');
    expect(full.headers['x-content-type-options']).toBe('nosniff');
  });

  const refusals = [
    { what: 'an SVG', name: 'pins.svg', bytes: Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"><circle r="4"/></svg>'), status: 415, message: /not a JPEG, PNG or WebP/ },
    { what: 'an SVG renamed .png', name: 'pins.png', bytes: Buffer.from('<?xml version="1.0"?><svg xmlns="http://www.w3.org/2000/svg" onload="alert(1)"/>'), status: 415, message: /not a JPEG, PNG or WebP/ },
    { what: 'a text file renamed .png', name: 'pins.png', bytes: Buffer.from('Pin 1: green/white\nPin 2: black/red\n'), status: 415, message: /not a JPEG, PNG or WebP/ },
    { what: 'a PNG with a script after its end (polyglot)', name: 'pins.png', bytes: Buffer.concat([TINY_PNG, Buffer.from('<script>alert(1)</script>')]), status: 415, message: /holds more than a picture/ },
    { what: 'a PNG whose image data is damaged', name: 'pins.png', bytes: Buffer.concat([TINY_PNG.subarray(0, 33), Buffer.from([0, 0, 0, 4, 0x49, 0x44, 0x41, 0x54, 1, 2, 3, 4, 0, 0, 0, 0]), TINY_PNG.subarray(-12)]), status: 415, message: /could not be read as a picture/ },
    { what: 'an oversize file', name: 'big.png', bytes: Buffer.concat([TINY_PNG, Buffer.alloc(MAX_PHOTO_BYTES + 1)]), status: 413, message: /too large.*8 MB/ },
  ];
  for (const r of refusals) {
    it(`refuses ${r.what} with ${r.status}, and stores nothing in the bucket or the table`, async () => {
      const ids = await createDraft(`Refuse ${r.what}`);
      const before = { objects: storedObjectCount(env), rows: await pictureRows() };
      const res = await upload(author, ids, r.bytes, r.name);
      expect(res.status, JSON.stringify(res.body)).toBe(r.status);
      expect(expectEnvelope(res.body).message).toMatch(r.message);
      expect({ objects: storedObjectCount(env), rows: await pictureRows() }).toEqual(before);
    });
  }

  it('refuses an upload without a picture or for a step id that is not an id, storing nothing', async () => {
    const ids = await createDraft('No file');
    const before = await pictureRows();
    const none = await author.agent.post(url(ids, '/pictures')).set('X-CSRF-Token', author.csrf).field('stepId', 'pulser');
    expect(none.status).toBe(400);
    expect(expectEnvelope(none.body).issues?.[0]?.path).toBe('picture');
    expect((await upload(author, ids, TINY_PNG, 'pins.png', 'not an id!')).status).toBe(400);
    expect(await pictureRows()).toBe(before);
  });

  it('a technician may not add pictures (403)', async () => {
    const ids = await createDraft('Tech upload');
    expect((await upload(tech, ids, TINY_PNG, 'pins.png')).status).toBe(403);
  });
});

describe('pictures belong to the version', () => {
  it('a saved draft names its pictures in order with captions; a caption is required', async () => {
    const ids = await createDraft('Captions');
    const a = (await upload(author, ids, stripedPng(), 'pins.png').expect(201)).body.id as string;
    const b = (await upload(author, ids, TINY_PNG, 'probe.png').expect(201)).body.id as string;
    const saved = await attach(ids, [{ id: b, caption: 'Back-probe the pulser lead here' }, { id: a, caption: 'Connector pins, latch up' }]);
    expect(saved.steps[0]!.pictures?.map((p) => p.id)).toEqual([b, a]);
    const current = (await author.get(url(ids)).expect(200)).body as { document: ProcedureDocument; lockVersion: number };
    const noCaption = structuredClone(current.document);
    noCaption.steps[0]!.pictures![0]!.caption = '';
    const res = await author.put(url(ids), { document: noCaption, lockVersion: current.lockVersion });
    expect(res.status).toBe(400);
    expect(JSON.stringify(expectEnvelope(res.body).issues)).toMatch(/pictures/);
  });

  it('a draft that names a picture the shop never stored is refused with 422 and nothing is saved', async () => {
    const ids = await createDraft('Unknown picture');
    const current = (await author.get(url(ids)).expect(200)).body as { document: ProcedureDocument; lockVersion: number };
    const bad = structuredClone(current.document);
    bad.steps[0]!.pictures = [{ id: '0b0f8f0e-6a51-4f0e-9d0a-333333333333', caption: 'Not stored' }];
    const res = await author.put(url(ids), { document: bad, lockVersion: current.lockVersion });
    expect(res.status).toBe(422);
    expect(expectEnvelope(res.body).issues?.[0]?.path).toBe('steps.0.pictures.0');
    expect((await author.get(url(ids)).expect(200)).body.lockVersion).toBe(current.lockVersion);
  });

  it("a published version's pictures cannot change: no upload, no save; a new draft carries the same pictures", async () => {
    const ids = await createDraft('Immutable pictures');
    const id = (await upload(author, ids, stripedPng(), 'pins.png').expect(201)).body.id as string;
    await attach(ids, [{ id, caption: 'Pulser connector' }]);
    await publish(ids);
    const before = { objects: storedObjectCount(env), rows: await pictureRows() };
    const late = await upload(author, ids, TINY_PNG, 'late.png');
    expect(late.status).toBe(409);
    expect(expectEnvelope(late.body).message).toMatch(/published.*start a new draft/);
    const pub = (await author.get(url(ids)).expect(200)).body as { document: ProcedureDocument; lockVersion: number };
    const changed = structuredClone(pub.document);
    changed.steps[0]!.pictures = [];
    expect((await author.put(url(ids), { document: changed, lockVersion: pub.lockVersion })).status).toBe(409);
    expect({ objects: storedObjectCount(env), rows: await pictureRows() }).toEqual(before);
    expect((await author.get(url(ids)).expect(200)).body.document.steps[0].pictures).toEqual([{ id, caption: 'Pulser connector' }]);
    // a new draft copies the references, not the bytes
    const next = (await author.post(`/api/procedures/${ids.procedureId}/drafts`, {}).expect(201)).body as { id: string; document: ProcedureDocument };
    expect(next.document.steps[0]!.pictures).toEqual([{ id, caption: 'Pulser connector' }]);
    expect({ objects: storedObjectCount(env), rows: await pictureRows() }).toEqual(before);
  });

  it('a technician of the shop reads the phone rendition; a technician of another shop gets 404 for every size', async () => {
    const ids = await createDraft('Foreign reader');
    const id = (await upload(author, ids, stripedPng(), 'pins.png').expect(201)).body.id as string;
    await attach(ids, [{ id, caption: 'Pins' }]);
    await publish(ids);
    const phone = await tech.get(`/api/pictures/${id}/phone`).buffer(true).expect(200);
    expect(phone.headers['content-type']).toBe('image/webp');
    const stranger = await otherShopMember(env, ['technician', 'author'], 'picture-stranger@elsewhere.test');
    for (const size of ['full', 'phone', 'thumb']) {
      const res = await stranger.get(`/api/pictures/${id}/${size}`);
      expect(res.status).toBe(404);
      expect(expectEnvelope(res.body).code).toBe('not_found');
    }
    expect((await upload(stranger, ids, TINY_PNG, 'pins.png')).status).toBe(404);
    expect((await tech.get(`/api/pictures/${id}/huge`)).status).toBe(404);
  });
});

describe('who may see a picture', () => {
  const sizes = ['full', 'phone', 'thumb'] as const;
  async function statuses(c: Client, id: string): Promise<number[]> {
    return Promise.all(sizes.map(async (size) => (await c.get(`/api/pictures/${id}/${size}`)).status));
  }

  it("a draft's picture is seen by authors and leads only; once a published version names it, technicians see it too; trainers and admins never (404)", async () => {
    const [trainer, admin] = await Promise.all([signInAs(env.app, 'trainer'), signInAs(env.app, 'admin')]);
    const ids = await createDraft('Draft picture access');
    const id = (await upload(author, ids, stripedPng(), 'pins.png').expect(201)).body.id as string;
    // uploaded, not yet saved into the draft: the editor shows its thumbnail already
    expect(await statuses(author, id)).toEqual([200, 200, 200]);
    await attach(ids, [{ id, caption: 'Pins' }]);
    expect(await statuses(lead, id)).toEqual([200, 200, 200]);
    for (const c of [tech, trainer, admin]) {
      const res = await c.get(`/api/pictures/${id}/phone`);
      expect(res.status).toBe(404);
      expect(expectEnvelope(res.body).code).toBe('not_found');
    }
    await publish(ids);
    expect(await statuses(tech, id)).toEqual([200, 200, 200]);
    expect(await statuses(trainer, id)).toEqual([404, 404, 404]);
    expect(await statuses(admin, id)).toEqual([404, 404, 404]);
    // retired, it stays readable: diagnoses that ran it still show it
    await lead.post(url(ids, '/retire')).expect(200);
    expect(await statuses(tech, id)).toEqual([200, 200, 200]);
  });

  it('a picture only the open draft names stays hidden from technicians while the published version does not name it', async () => {
    const ids = await createDraft('New picture in the next draft');
    await publish(ids);
    const next = (await author.post(`/api/procedures/${ids.procedureId}/drafts`, {}).expect(201)).body as { id: string };
    const draft = { procedureId: ids.procedureId, draftId: next.id };
    const id = (await upload(author, draft, stripedPng(), 'pins.png').expect(201)).body.id as string;
    const current = (await author.get(url(draft)).expect(200)).body as { lockVersion: number };
    await attach({ ...draft, lock: current.lockVersion }, [{ id, caption: 'Pins, new' }]);
    expect(await statuses(tech, id)).toEqual([404, 404, 404]);
    expect(await statuses(author, id)).toEqual([200, 200, 200]);
  });

  it('a technician sees the pictures of a version their own diagnosis pinned, not those of a colleague\'s', async () => {
    const ids = await createDraft('Pinned by a diagnosis');
    const id = (await upload(author, ids, stripedPng(), 'pins.png').expect(201)).body.id as string;
    await attach(ids, [{ id, caption: 'Pins' }]);
    // a diagnosis pinned to this (unpublished) version, written straight to the table: only the pin grants the picture
    const shopId = (await Procedure.findByPk(ids.procedureId))!.shopId;
    const [techUser, leadUser, vehicle] = await Promise.all([
      User.findOne({ where: { email: 'tech@larkspur.test' } }), User.findOne({ where: { email: 'lead@larkspur.test' } }), Vehicle.findOne({ where: { shopId } }),
    ]);
    const pin = (technicianId: string) => Diagnosis.create({
      id: randomUUID(), shopId, procedureVersionId: ids.draftId, vehicleId: vehicle!.id, technicianId, meterId: null, complaint: 'Will not start',
      conditions: { engine: 'cold', ambientC: 18, startingMethod: 'kick', batteryVolts: null }, endingStepId: null, outcome: null, endedAt: null, startedAt: new Date(),
    });
    await pin(leadUser!.id);
    expect(await statuses(tech, id)).toEqual([404, 404, 404]);
    await pin(techUser!.id);
    expect(await statuses(tech, id)).toEqual([200, 200, 200]);
  });

  it('answers with one database query, and 404 for an id that was never stored', async () => {
    const ids = await createDraft('One query');
    const id = (await upload(author, ids, stripedPng(), 'pins.png').expect(201)).body.id as string;
    await attach(ids, [{ id, caption: 'Pins' }]);
    await publish(ids);
    const shopId = (await Procedure.findByPk(ids.procedureId))!.shopId;
    const techUser = await User.findOne({ where: { email: 'tech@larkspur.test' } });
    const { sequelize } = env.runtime.deps;
    let queries = 0;
    const count = () => { queries++; };
    sequelize.addHook('beforeQuery', 'count-picture-queries', count);
    try {
      const picture = await readPicture(env.runtime.deps, { userId: techUser!.id, shopId, roles: ['technician'] }, id, 'phone');
      expect(picture.contentType).toBe('image/webp');
    } finally {
      sequelize.removeHook('beforeQuery', 'count-picture-queries');
    }
    expect(queries).toBe(1);
    expect(await statuses(author, randomUUID())).toEqual([404, 404, 404]);
  });
});

describe('housekeeping sweeps pictures no version names', () => {
  const backdate = (ids: string[], hours: number) => env.runtime.deps.sequelize.query(
    `UPDATE step_pictures SET created_at = now() - make_interval(hours => ${hours}) WHERE id IN (:ids)`, { replacements: { ids } },
  );
  const rowsOf = async (ids: string[]) => (await env.runtime.deps.sequelize.query<{ id: string }>(
    'SELECT id FROM step_pictures WHERE id IN (:ids)', { replacements: { ids }, type: QueryTypes.SELECT },
  )).map((r) => r.id).sort();

  it('removes the rows and the three objects of old unnamed pictures; keeps fresh uploads and every picture a draft or a published version names', async () => {
    const ids = await createDraft('Sweep');
    const up = async (name: string) => (await upload(author, ids, stripedPng(), name).expect(201)).body.id as string;
    const [keptByPublished, keptByDraft, dropped, neverSaved, fresh] = [await up('a.png'), await up('b.png'), await up('c.png'), await up('d.png'), await up('e.png')];
    await attach(ids, [{ id: keptByPublished, caption: 'Published' }, { id: dropped, caption: 'Dropped later' }]);
    await publish(ids);
    // the next draft drops two and names a third: `dropped` is still named by the published version
    const next = (await author.post(`/api/procedures/${ids.procedureId}/drafts`, {}).expect(201)).body as { id: string; lockVersion: number };
    const draft = { procedureId: ids.procedureId, draftId: next.id, lock: next.lockVersion };
    await attach(draft, [{ id: keptByDraft, caption: 'Draft only' }]);
    await backdate([keptByPublished, keptByDraft, dropped, neverSaved], 25);
    const before = storedObjectCount(env);
    expect(await sweepUnnamedPictures(env.runtime.deps)).toBe(1);
    expect(storedObjectCount(env)).toBe(before - 3);
    expect(await rowsOf([keptByPublished, keptByDraft, dropped, neverSaved, fresh])).toEqual([keptByPublished, keptByDraft, dropped, fresh].sort());
    for (const size of ['full', 'phone', 'thumb']) expect((await author.get(`/api/pictures/${neverSaved}/${size}`)).status).toBe(404);
    expect((await author.get(`/api/pictures/${keptByDraft}/full`).buffer(true)).status).toBe(200);
    // a second sweep finds nothing more; a picture under the grace period is never swept
    expect(await sweepUnnamedPictures(env.runtime.deps)).toBe(0);
    await backdate([fresh], 23);
    expect(await sweepUnnamedPictures(env.runtime.deps)).toBe(0);
    await backdate([fresh], 25);
    expect(await sweepUnnamedPictures(env.runtime.deps)).toBe(1);
    expect(await rowsOf([fresh])).toEqual([]);
  });

  it('a picture named only by a copy in another procedure is kept', async () => {
    const ids = await createDraft('Sweep copy source');
    const id = (await upload(author, ids, stripedPng(), 'pins.png').expect(201)).body.id as string;
    await attach(ids, [{ id, caption: 'Pins' }]);
    const copy = await author.post(`/api/procedures/${ids.procedureId}/duplicate`, { title: 'Sweep copy' });
    expect(copy.status, JSON.stringify(copy.body)).toBe(201);
    // the source draft drops the picture; only the copy names it now
    const current = (await author.get(url(ids)).expect(200)).body as { lockVersion: number };
    await attach({ ...ids, lock: current.lockVersion }, []);
    await backdate([id], 25);
    await sweepUnnamedPictures(env.runtime.deps);
    expect(await rowsOf([id])).toEqual([id]);
  });
});

describe('the procedure file carries its pictures', () => {
  it('export then import restores every picture byte for byte, under new ids, with captions and order', async () => {
    const ids = await createDraft('Round trip pictures');
    const png = stripedPng();
    const jpeg = await bigJpeg();
    const a = (await upload(author, ids, png, 'pins.png').expect(201)).body.id as string;
    const b = (await upload(author, ids, jpeg, 'stator.jpg').expect(201)).body.id as string;
    await attach(ids, [{ id: a, caption: 'Pins' }, { id: b, caption: 'Stator, exciter lead' }]);
    const file = JSON.parse((await author.get(url(ids, '/export')).expect(200)).text);
    expect(file.document.schemaVersion).toBe(2);
    expect(file.pictures.map((p: { id: string; contentType: string }) => [p.id, p.contentType]).sort()).toEqual([[a, 'image/png'], [b, 'image/jpeg']].sort());
    const imported = await author.post('/api/procedures/import', { file, title: 'Imported with pictures' }).expect(201);
    expect(imported.body.pictures).toBe(2);
    const draft = (await author.get(`/api/procedures/${imported.body.procedureId}/versions/${imported.body.draftId}`).expect(200)).body as { document: ProcedureDocument };
    const pics = draft.document.steps[0]!.pictures!;
    expect(pics.map((p) => p.caption)).toEqual(['Pins', 'Stator, exciter lead']);
    expect(pics.map((p) => p.id)).not.toContain(a);
    const backA = await author.get(`/api/pictures/${pics[0]!.id}/full`).buffer(true).expect(200);
    const backB = await author.get(`/api/pictures/${pics[1]!.id}/full`).buffer(true).expect(200);
    expect(Buffer.compare(backA.body as Buffer, png)).toBe(0);
    expect(Buffer.compare(backB.body as Buffer, jpeg)).toBe(0);
  });

  it('a file whose step names a picture it does not carry, or carries an SVG, is refused with 422 and nothing is stored', async () => {
    const ids = await createDraft('Broken file');
    const id = (await upload(author, ids, stripedPng(), 'pins.png').expect(201)).body.id as string;
    await attach(ids, [{ id, caption: 'Pins' }]);
    const file = JSON.parse((await author.get(url(ids, '/export')).expect(200)).text);
    const before = { procedures: await Procedure.count(), objects: storedObjectCount(env), rows: await pictureRows() };
    const missing = await author.post('/api/procedures/import', { file: { ...file, pictures: [] } });
    expect(missing.status).toBe(422);
    expect(expectEnvelope(missing.body).issues?.[0]?.path).toBe('steps.0 (pulser).pictures.0');
    const svg = Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>').toString('base64');
    const smuggled = await author.post('/api/procedures/import', { file: { ...file, pictures: [{ ...file.pictures[0], data: svg }] } });
    expect(smuggled.status).toBe(422);
    expect(expectEnvelope(smuggled.body).issues?.[0]?.message).toMatch(/not a JPEG, PNG or WebP/);
    expect({ procedures: await Procedure.count(), objects: storedObjectCount(env), rows: await pictureRows() }).toEqual(before);
  });

  it('a file larger than the usual 5 MB request limit imports when its pictures make it so', async () => {
    // 1200 × 1000 of noise: a PNG that does not compress, about 4.6 MB, so over 6 MB as base64
    const png = new PNG({ width: 1200, height: 1000 });
    let x = 12345;
    for (let i = 0; i < png.data.length; i++) { x = (Math.imul(x, 1103515245) + 12345) >>> 0; png.data[i] = i % 4 === 3 ? 255 : x >>> 24; }
    const noisy = PNG.sync.write(png);
    const ids = await createDraft('Big file');
    const id = (await upload(author, ids, noisy, 'wiring.png').expect(201)).body.id as string;
    await attach(ids, [{ id, caption: 'Wiring sketch' }]);
    const text = (await author.get(url(ids, '/export')).expect(200)).text;
    expect(text.length).toBeGreaterThan(5 * 1024 * 1024);
    const res = await author.post('/api/procedures/import', { file: JSON.parse(text), title: 'Big file imported' });
    expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(201);
    expect(res.body.pictures).toBe(1);
  });

  it('a version 1 file (before pictures) still imports, upgraded to version 2', async () => {
    const v1 = { ...soundDocument('Old file'), schemaVersion: 1 };
    const res = await author.post('/api/procedures/import', { file: { format: 'sparkwright-procedure', document: v1 } }).expect(201);
    expect(res.body.upgradedFrom).toBe(1);
  });
});
