import { randomUUID } from 'node:crypto';
import { Attachment, Diagnosis, Invitation, Membership, Meter, PasswordReset, Procedure, ProcedureVersion, Shop, User, Vehicle } from '../../server/models';
import { hashToken, newLinkToken } from '../../server/lib/tokens';
import type { Role } from '@shared/schema/roles';
import { fixtureDoc, publishFixture } from './debrief.fixture';
import type { Client, TestEnv } from './harness';
import { TINY_PNG } from './bench-fixtures';
import { preparePicture, storePictures } from '../../server/services/step-picture.service';

/**
 * The rows of one shop that the authorization matrix points at: a published procedure, a
 * machine, a diagnosis with a photo, a member and an invitation; and makers of fresh rows for the
 * routes that change state (each allowed call gets its own draft, diagnosis or member).
 */
export interface ShopWorld {
  shopId: string;
  procedureId: string;
  versionId: string;
  slug: string;
  vehicleId: string;
  meterId: string;
  /** a diagnosis of the shop's technician */
  diagnosisId: string;
  attachmentId: string;
  /** a reference picture stored for, and named by, the published procedure's step `prepare` */
  pictureId: string;
  memberId: string;
  /** the technician whose diagnoses these are */
  technicianId: string;
  fresh: {
    /** an active diagnosis of the shop's technician, no step answered yet (start step `prepare`) */
    diagnosis(): Promise<string>;
    /** a procedure whose only version is in this status (a sound document) */
    version(status: 'draft' | 'in_review' | 'published'): Promise<{ procedureId: string; versionId: string }>;
    /** a membership of a new person, as a technician */
    member(): Promise<string>;
    invitation(): Promise<string>;
  };
}

const uniq = () => randomUUID().slice(0, 8);

export async function buildWorld(env: TestEnv, shopId: string, technicianId: string, photo: (diagnosisId: string) => Promise<string>): Promise<ShopWorld> {
  const slug = `matrix-${uniq()}`;
  const { procedureId, versionId } = await publishFixture(env.runtime.deps, shopId, slug);
  const vehicle = await Vehicle.create({ shopId, label: `MX-${uniq()}`, model: 'Wren 50' });
  const meter = await Meter.create({ shopId, name: `Matrix meter ${uniq()}`, spec: { entries: [] } });
  const diagnosis = async () => {
    const id = randomUUID();
    await Diagnosis.create({
      id, shopId, procedureVersionId: versionId, vehicleId: vehicle.id, technicianId, meterId: null, complaint: 'Will not start',
      conditions: { engine: 'cold', ambientC: 18, startingMethod: 'kick', batteryVolts: null }, endingStepId: null, outcome: null, endedAt: null, startedAt: new Date(),
    });
    return id;
  };
  const version = async (status: 'draft' | 'in_review' | 'published') => {
    const p = await Procedure.create({ shopId, slug: `matrix-${uniq()}`, title: `Matrix ${uniq()}`, symptom: 'No spark', ignitionSystem: 'magneto-cdi', archivedAt: null, createdBy: null });
    const published = status === 'published';
    const v = await ProcedureVersion.create({
      shopId, procedureId: p.id, number: published ? 1 : null, status, document: fixtureDoc() as unknown as Record<string, unknown>,
      basedOnId: null, createdBy: null, updatedBy: null, publishedBy: null, publishedAt: published ? new Date() : null, retiredAt: null,
    });
    return { procedureId: p.id, versionId: v.id };
  };
  const member = async () => {
    const user = await User.create({ email: `member-${uniq()}@matrix.test`, name: 'Matrix Member', passwordHash: 'not-a-password' });
    return (await Membership.create({ shopId, userId: user.id, roles: ['technician'] })).id;
  };
  const invitation = async () => (await Invitation.create({
    shopId, email: `invitee-${uniq()}@matrix.test`, name: '', roles: ['technician'], tokenHash: newLinkToken().hash, invitedBy: null,
    expiresAt: new Date(Date.now() + 86_400_000), acceptedAt: null,
  })).id;
  const diagnosisId = await diagnosis();
  const pictureId = randomUUID();
  await storePictures(env.runtime.deps, { shopId, procedureId, versionId, userId: technicianId }, [{ id: pictureId, stepId: 'prepare', picture: await preparePicture(TINY_PNG, 'pins.png') }]);
  // the published version names it, as a lead's publish would have left it
  const named = fixtureDoc();
  named.steps = named.steps.map((s) => (s.id === 'prepare' ? { ...s, pictures: [{ id: pictureId, caption: 'Plug lead' }] } : s));
  await ProcedureVersion.update({ document: named as unknown as Record<string, unknown> }, { where: { id: versionId } });
  return {
    pictureId,
    shopId, procedureId, versionId, slug, vehicleId: vehicle.id, meterId: meter.id, diagnosisId, technicianId,
    attachmentId: await photo(diagnosisId), memberId: await member(),
    fresh: { diagnosis, version, member, invitation },
  };
}

/** Uploads a photo and its thumbnail through the API, as the phone does; returns the photo's id. */
export function uploadPhoto(c: Client): (diagnosisId: string) => Promise<string> {
  return async (diagnosisId) => {
    const res = await c.agent.post('/api/attachments').set('X-CSRF-Token', c.csrf).field('id', randomUUID()).field('diagnosisId', diagnosisId)
      .attach('photo', TINY_PNG, 'photo.png').attach('thumb', TINY_PNG, 'thumb.png');
    if (res.status !== 201) throw new Error(`photo upload failed: ${res.status} ${res.text}`);
    return (res.body as { id: string }).id;
  };
}

/** A stored photo row for a shop whose bytes the matrix never reads (a foreign id must 404 before that). */
export async function photoRow(shopId: string, diagnosisId: string): Promise<string> {
  const a = await Attachment.create({
    id: randomUUID(), shopId, diagnosisId, stepId: null, objectKey: `shops/${shopId}/matrix.png`, thumbKey: null,
    contentType: 'image/png', byteSize: 1, originalName: 'matrix.png', createdBy: null,
  });
  return a.id;
}

/** A second shop with one member who holds every role there, and nothing in the demo shop. */
export async function foreignShop(roles: Role[]): Promise<{ shopId: string; userId: string }> {
  const shop = await Shop.create({ slug: `foreign-${uniq()}`, name: 'Foreign Shop' });
  const user = await User.create({ email: `foreign-${uniq()}@elsewhere.test`, name: 'Foreign Member', passwordHash: 'not-a-password' });
  await Membership.create({ shopId: shop.id, userId: user.id, roles });
  return { shopId: shop.id, userId: user.id };
}

/** A pending invitation whose raw token the test knows. */
export async function invitationToken(shopId: string): Promise<string> {
  const token = newLinkToken();
  await Invitation.create({
    shopId, email: `invitee-${uniq()}@matrix.test`, name: '', roles: ['technician'], tokenHash: token.hash, invitedBy: null,
    expiresAt: new Date(Date.now() + 86_400_000), acceptedAt: null,
  });
  return token.raw;
}

/** A password-reset token of a new, throwaway account. */
export async function resetToken(): Promise<string> {
  const user = await User.create({ email: `reset-${uniq()}@matrix.test`, name: 'Reset Person', passwordHash: 'not-a-password' });
  const raw = `matrix-reset-${randomUUID()}`;
  await PasswordReset.create({ userId: user.id, tokenHash: hashToken(raw), expiresAt: new Date(Date.now() + 3_600_000), usedAt: null });
  return raw;
}
