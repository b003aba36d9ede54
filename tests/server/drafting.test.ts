import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { startTestApp, signInAs, otherShopMember, expectEnvelope, type TestEnv, type Client } from './harness';
import { doc, ohmsReading, observation, finding } from '../shared/fixtures';
import { randomUUID } from 'node:crypto';
import { Diagnosis, Procedure, ProcedureVersion, User, Vehicle } from '../../server/models';
import { CURRENT_SCHEMA_VERSION, type ProcedureDocument } from '@shared/schema';

let env: TestEnv;
let author: Client;
let lead: Client;
let tech: Client;
let trainer: Client;

beforeAll(async () => {
  env = await startTestApp();
  [author, lead, tech, trainer] = await Promise.all([
    signInAs(env.app, 'author'), signInAs(env.app, 'lead'), signInAs(env.app, 'tech'), signInAs(env.app, 'trainer'),
  ]);
});
afterAll(async () => { await env.close(); });

const META = { title: 'Coil check', symptom: 'No spark at the plug', ignitionSystem: 'magneto-cdi' as const };

/** A sound little procedure: one Reading with three bands, an Observation and two Findings. */
function soundDocument(title = META.title): ProcedureDocument {
  const d = doc([
    ohmsReading('coilPrimary', 0.2, 1.0, { low: 'shorted', ok: 'sparkSeen', high: 'openCoil' }),
    observation('sparkSeen', { yes: 'openCoil', no: 'shorted' }),
    finding('shorted'),
    finding('openCoil'),
  ]);
  return { ...d, meta: { ...d.meta, ...META, title } };
}

/** The same document with a gap between the "Below" and "Within" bands (0.1 .. 0.2 Ω routes nowhere). */
function gappedDocument(): ProcedureDocument {
  const d = soundDocument();
  const reading = d.steps[0]!;
  if (reading.kind !== 'reading') throw new Error('fixture changed');
  reading.bands[0]!.upper = { value: 0.1, inclusive: false };
  return d;
}

async function createDraft(title = META.title): Promise<{ procedureId: string; draftId: string }> {
  const res = await author.post('/api/procedures', { meta: { ...META, title } }).expect(201);
  return res.body as { procedureId: string; draftId: string };
}

function save(c: Client, ids: { procedureId: string; draftId: string }, document: ProcedureDocument, lockVersion: number) {
  return c.put(`/api/procedures/${ids.procedureId}/versions/${ids.draftId}`, { document, lockVersion });
}

const url = (ids: { procedureId: string; draftId: string }, tail = '') => `/api/procedures/${ids.procedureId}/versions/${ids.draftId}${tail}`;

describe('the draft, review and publish life cycle', () => {
  it('an author drafts and submits, a lead comments and publishes version 1, and a new draft starts from it', async () => {
    const ids = await createDraft('Life cycle');
    const saved = await save(author, ids, soundDocument('Life cycle'), 1).expect(200);
    expect(saved.body).toMatchObject({ status: 'draft', number: null, lockVersion: 2, errors: 0, updatedBy: 'Morgan Author' });

    await author.post(url(ids, '/submit')).expect(200);
    const comment = await lead.post(url(ids, '/comments'), { body: 'Say which lead to use.', stepId: 'coilPrimary' }).expect(201);
    expect(comment.body).toMatchObject({ author: 'Rowan Lead', stepId: 'coilPrimary' });
    const published = await lead.post(url(ids, '/publish')).expect(200);
    expect(published.body).toMatchObject({ status: 'published', number: 1, publishedBy: 'Rowan Lead' });

    const next = await author.post(`/api/procedures/${ids.procedureId}/drafts`, {}).expect(201);
    expect(next.body).toMatchObject({ status: 'draft', number: null, basedOnId: ids.draftId });
    expect(next.body.document).toEqual(published.body.document);
    const second = { procedureId: ids.procedureId, draftId: next.body.id as string };
    const changed = soundDocument('Life cycle');
    changed.steps[2] = { ...changed.steps[2]!, title: 'Primary winding shorted' };
    await save(author, second, changed, next.body.lockVersion).expect(200);
    await author.post(url(second, '/submit')).expect(200);
    expect((await lead.post(url(second, '/publish')).expect(200)).body.number).toBe(2);

    await lead.post(url(ids, '/retire')).expect(200);
    const detail = await tech.get(`/api/procedures/${ids.procedureId}`).expect(200);
    expect(detail.body.versions.map((v: { number: number; status: string }) => [v.number, v.status])).toEqual([[2, 'published'], [1, 'retired']]);
  });

  it('a published version is never edited: saving, submitting or publishing it again is refused and it stays as it was', async () => {
    const ids = await createDraft('Immutable');
    await save(author, ids, soundDocument('Immutable'), 1).expect(200);
    await author.post(url(ids, '/submit')).expect(200);
    const pub = await lead.post(url(ids, '/publish')).expect(200);
    const before = await ProcedureVersion.findByPk(ids.draftId);

    const edit = await save(author, ids, gappedDocument(), pub.body.lockVersion);
    expect(edit.status).toBe(409);
    expect(expectEnvelope(edit.body).code).toBe('wrong_status');
    expect((await author.post(url(ids, '/submit'))).status).toBe(409);
    expect((await lead.post(url(ids, '/publish'))).status).toBe(409);

    const after = await ProcedureVersion.findByPk(ids.draftId);
    expect(after!.document).toEqual(before!.document);
    expect(after!.number).toBe(1);
  });

  it('a second open draft of the same procedure is refused with 409', async () => {
    const ids = await createDraft('One draft');
    await save(author, ids, soundDocument('One draft'), 1).expect(200);
    await author.post(url(ids, '/submit')).expect(200);
    await lead.post(url(ids, '/publish')).expect(200);
    await author.post(`/api/procedures/${ids.procedureId}/drafts`, {}).expect(201);
    const again = await author.post(`/api/procedures/${ids.procedureId}/drafts`, {});
    expect(again.status).toBe(409);
    expect(expectEnvelope(again.body).message).toMatch(/already has an open draft/);
  });

  it('a lead sends a draft back with a reason, and the author can edit it again', async () => {
    const ids = await createDraft('Sent back');
    await author.post(url(ids, '/submit')).expect(200);
    const back = await lead.post(url(ids, '/send-back'), { comment: 'Add the band for an open winding.' }).expect(200);
    expect(back.body.status).toBe('draft');
    const comments = await author.get(url(ids, '/comments')).expect(200);
    expect(comments.body).toEqual([expect.objectContaining({ body: 'Add the band for an open winding.', author: 'Rowan Lead' })]);
    await save(author, ids, soundDocument('Sent back'), back.body.lockVersion).expect(200);
  });

  it('an author takes a draft back from review to edit it; a technician or trainer cannot, and a draft not in review cannot be taken back', async () => {
    const ids = await createDraft('Taken back');
    await author.post(url(ids, '/submit')).expect(200);
    expect((await tech.post(url(ids, '/take-back'))).status).toBe(403);
    expect((await trainer.post(url(ids, '/take-back'))).status).toBe(403);
    const back = await author.post(url(ids, '/take-back')).expect(200);
    expect(back.body.status).toBe('draft');
    await save(author, ids, soundDocument('Taken back'), back.body.lockVersion).expect(200);
    const twice = await author.post(url(ids, '/take-back'));
    expect(twice.status).toBe(409);
    expect(expectEnvelope(twice.body).message).toMatch(/taken back/);
  });
});

describe('saving with optimistic concurrency', () => {
  it('a stale save answers 409 with who changed the draft and when, and does not overwrite it', async () => {
    const ids = await createDraft('Two tabs');
    const first = await save(author, ids, soundDocument('Two tabs'), 1).expect(200);
    const stale = await save(author, ids, gappedDocument(), 1);
    expect(stale.status).toBe(409);
    const err = expectEnvelope(stale.body) as ReturnType<typeof expectEnvelope> & { changedBy: string; changedAt: string; lockVersion: number };
    expect(err.code).toBe('stale_draft');
    expect(err.changedBy).toBe('Morgan Author');
    expect(err.changedAt).toBe(first.body.updatedAt);
    expect(err.lockVersion).toBe(2);
    const stored = await author.get(url(ids)).expect(200);
    expect(stored.body.document).toEqual(first.body.document);
    expect(stored.body.lockVersion).toBe(2);
  });
});

describe('the soundness check on publish', () => {
  it('publishing is refused while a band gap stands, with the finding named, and nothing is numbered', async () => {
    const ids = await createDraft('Gap');
    const saved = await save(author, ids, gappedDocument(), 1).expect(200);
    expect(saved.body.errors).toBeGreaterThan(0);
    await author.post(url(ids, '/submit')).expect(200);
    const res = await lead.post(url(ids, '/publish'));
    expect(res.status).toBe(422);
    const err = expectEnvelope(res.body);
    expect(err.code).toBe('unsound_procedure');
    expect(err.issues).toEqual(expect.arrayContaining([expect.objectContaining({ path: 'steps.coilPrimary' })]));
    const row = await ProcedureVersion.findByPk(ids.draftId);
    expect({ status: row!.status, number: row!.number }).toEqual({ status: 'in_review', number: null });
  });
});

describe('import and export', () => {
  it('an exported version imports again as a new draft with the same steps', async () => {
    const ids = await createDraft('Round trip');
    await save(author, ids, soundDocument('Round trip'), 1).expect(200);
    const exported = await author.get(url(ids, '/export')).expect(200);
    expect(exported.headers['content-disposition']).toMatch(/round-trip-draft\.json/);
    const file = JSON.parse(exported.text);
    expect(file).toMatchObject({ format: 'sparkwright-procedure', document: { schemaVersion: CURRENT_SCHEMA_VERSION } });
    const imported = await author.post('/api/procedures/import', { file, title: 'Round trip imported' }).expect(201);
    const draft = await author.get(`/api/procedures/${imported.body.procedureId}/versions/${imported.body.draftId}`).expect(200);
    expect(draft.body.document.steps).toEqual(file.document.steps);
    expect(draft.body.document.meta.title).toBe('Round trip imported');
  });

  it('a bad file is refused with a problem per step and nothing is stored', async () => {
    const before = { procedures: await Procedure.count(), versions: await ProcedureVersion.count() };
    const bad = soundDocument('Bad import') as unknown as { steps: Record<string, unknown>[] };
    bad.steps[0]!.unit = 'furlongs';
    delete bad.steps[2]!.cause;
    const res = await author.post('/api/procedures/import', { file: bad });
    expect(res.status).toBe(422);
    const err = expectEnvelope(res.body);
    expect(err.code).toBe('import_invalid');
    expect(err.message).toMatch(/Nothing was stored/);
    const paths = (err.issues ?? []).map((i) => i.path);
    expect(paths).toEqual(expect.arrayContaining(['steps.0 (coilPrimary).unit', 'steps.2 (shorted).cause']));
    expect({ procedures: await Procedure.count(), versions: await ProcedureVersion.count() }).toEqual(before);
  });

  it('a file where two steps share an id is refused, naming the id, and nothing is stored', async () => {
    const before = await Procedure.count();
    const d = soundDocument('Twins');
    d.steps.push({ ...d.steps[3]! });
    const res = await author.post('/api/procedures/import', { file: { format: 'sparkwright-procedure', document: d } });
    expect(res.status).toBe(422);
    expect(expectEnvelope(res.body).issues).toEqual([expect.objectContaining({ message: expect.stringContaining('"openCoil" is used more than once') })]);
    expect(await Procedure.count()).toBe(before);
  });

  it('a file from a newer schema version is refused with what to do', async () => {
    const res = await author.post('/api/procedures/import', { file: { ...soundDocument(), schemaVersion: 99 } });
    expect(res.status).toBe(422);
    expect(expectEnvelope(res.body).message).toMatch(/newer than this app understands/);
  });
});

describe('roles and shops', () => {
  it('technicians and trainers cannot create, save or publish, and leads cannot edit drafts', async () => {
    const ids = await createDraft('Roles');
    expect((await tech.post('/api/procedures', { meta: META })).status).toBe(403);
    expect((await trainer.post('/api/procedures/import', { file: soundDocument() })).status).toBe(403);
    expect((await save(lead, ids, soundDocument('Roles'), 1)).status).toBe(403);
    await author.post(url(ids, '/submit')).expect(200);
    expect((await author.post(url(ids, '/publish'))).status).toBe(403);
    expect((await tech.post(url(ids, '/retire'))).status).toBe(403);
    expect((await tech.post(url(ids, '/comments'), { body: 'Looks fine' })).status).toBe(403);
    expect((await trainer.post(`/api/procedures/${ids.procedureId}/archive`, { archived: true })).status).toBe(403);
  });

  it('technicians and trainers do not see drafts at all: the draft and a never-published procedure are 404 to them', async () => {
    const ids = await createDraft('Hidden draft');
    expect((await tech.get(url(ids))).status).toBe(404);
    expect((await trainer.get(`/api/procedures/${ids.procedureId}`)).status).toBe(404);
    const list = await tech.get('/api/procedures').expect(200);
    expect(list.body.map((p: { id: string }) => p.id)).not.toContain(ids.procedureId);
  });

  it("a foreign shop's procedure and version ids answer 404, as does an id that is not a uuid", async () => {
    const ids = await createDraft('Ours');
    const other = await otherShopMember(env, ['author', 'lead']);
    for (const res of [
      await other.get(`/api/procedures/${ids.procedureId}`),
      await other.get(url(ids)),
      await save(other, ids, soundDocument(), 1),
      await other.post(url(ids, '/submit')),
      await other.post(`/api/procedures/${ids.procedureId}/duplicate`, {}),
      await author.get('/api/procedures/not-a-uuid'),
    ]) {
      expect(res.status).toBe(404);
      expect(expectEnvelope(res.body).code).toBe('not_found');
    }
    expect((await other.get('/api/procedures').expect(200)).body).toEqual([]);
  });
});

describe('the procedure list', () => {
  it('searches by title or symptom, filters by status, duplicates and archives', async () => {
    const ids = await createDraft('Zebra lead check');
    const found = await author.get('/api/procedures?q=zebra%20lead').expect(200);
    expect(found.body).toEqual([expect.objectContaining({
      id: ids.procedureId, draft: expect.objectContaining({ status: 'draft' }), published: null, diagnoses: 0, lastEditedBy: 'Morgan Author',
    })]);
    const inReview = await author.get('/api/procedures?status=in_review').expect(200);
    expect(inReview.body.map((p: { id: string }) => p.id)).not.toContain(ids.procedureId);

    const copy = await author.post(`/api/procedures/${ids.procedureId}/duplicate`, {}).expect(201);
    const copied = await author.get(`/api/procedures/${copy.body.procedureId}`).expect(200);
    expect(copied.body.title).toBe('Zebra lead check (copy)');

    await author.post(`/api/procedures/${ids.procedureId}/archive`, { archived: true }).expect(200);
    const live = await author.get('/api/procedures?q=zebra').expect(200);
    expect(live.body.map((p: { id: string }) => p.id)).toEqual([copy.body.procedureId]);
    const archived = await author.get('/api/procedures?q=zebra&archived=1').expect(200);
    expect(archived.body.map((p: { id: string }) => p.id)).toEqual([ids.procedureId]);
  });
});

describe('versions and the diagnoses that ran them', () => {
  it('a diagnosis keeps pointing at version 1 after version 2 is published and version 1 retired, and the list counts it', async () => {
    const ids = await createDraft('Pinned version');
    await save(author, ids, soundDocument('Pinned version'), 1).expect(200);
    await author.post(url(ids, '/submit')).expect(200);
    await lead.post(url(ids, '/publish')).expect(200);
    const techUser = await User.findOne({ where: { email: 'tech@larkspur.test' } });
    const v1 = await ProcedureVersion.findByPk(ids.draftId);
    const vehicle = await Vehicle.findOne({ where: { shopId: v1!.shopId } });
    const diagnosisId = randomUUID();
    await Diagnosis.create({
      id: diagnosisId, shopId: v1!.shopId, procedureVersionId: v1!.id, vehicleId: vehicle!.id, technicianId: techUser!.id,
      meterId: null, endingStepId: null, outcome: null, endedAt: null,
    });

    const next = await author.post(`/api/procedures/${ids.procedureId}/drafts`, {}).expect(201);
    const second = { procedureId: ids.procedureId, draftId: next.body.id as string };
    await author.post(url(second, '/submit')).expect(200);
    await lead.post(url(second, '/publish')).expect(200);
    await lead.post(url(ids, '/retire')).expect(200);

    expect((await Diagnosis.findByPk(diagnosisId))!.procedureVersionId).toBe(ids.draftId);
    const row = (await lead.get('/api/procedures?q=pinned').expect(200)).body[0];
    expect(row).toMatchObject({ id: ids.procedureId, diagnoses: 1, published: { number: 2 } });
    const retired = await tech.get(url(ids)).expect(200);
    expect(retired.body).toMatchObject({ status: 'retired', number: 1 });
  });
});
