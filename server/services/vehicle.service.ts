import { Op, UniqueConstraintError, col, fn } from 'sequelize';
import type { ShopContext } from '../auth/context';
import { Diagnosis, Vehicle } from '../models';
import { AppError, notFound } from '../lib/errors';
import type { VehicleDto, VehicleInput } from '@shared/schema/vehicle';
import { audit } from './audit';

export function toVehicleDto(v: Vehicle): VehicleDto {
  return { id: v.id, label: v.label, model: v.model, frameNumber: v.frameNumber, hours: v.hours, notes: v.notes, updatedAt: v.updatedAt.toISOString() };
}

export async function listVehicles(ctx: ShopContext, q?: string): Promise<VehicleDto[]> {
  const like = q ? { [Op.iLike]: `%${q.replace(/[%_\\]/g, (c) => '\\' + c)}%` } : undefined;
  const rows = await Vehicle.findAll({
    where: { shopId: ctx.shopId, ...(like ? { [Op.or]: [{ label: like }, { model: like }, { frameNumber: like }] } : {}) },
    order: [['label', 'ASC']],
    limit: 500,
  });
  const last = await Diagnosis.findAll({
    where: { shopId: ctx.shopId, vehicleId: rows.map((v) => v.id) },
    attributes: ['vehicleId', [fn('max', col('started_at')), 'lastDiagnosedAt']],
    group: ['vehicleId'],
    raw: true,
  }) as unknown as { vehicleId: string; lastDiagnosedAt: Date }[];
  const lastBy = new Map(last.map((l) => [l.vehicleId, new Date(l.lastDiagnosedAt).toISOString()]));
  return rows.map((v) => ({ ...toVehicleDto(v), lastDiagnosedAt: lastBy.get(v.id) ?? null }));
}

function duplicateLabel(label: string): AppError {
  return new AppError(409, 'duplicate', `A machine labelled "${label}" already exists in this shop. Pick it from the list or use another label.`,
    [{ path: 'label', message: 'Already used in this shop' }]);
}

export async function createVehicle(ctx: ShopContext, input: VehicleInput): Promise<VehicleDto> {
  try {
    const v = await Vehicle.create({ ...input, shopId: ctx.shopId });
    await audit({ shopId: ctx.shopId, userId: ctx.userId, action: 'vehicle.created', entity: 'vehicle', entityId: v.id });
    return toVehicleDto(v);
  } catch (e) {
    if (e instanceof UniqueConstraintError) throw duplicateLabel(input.label);
    throw e;
  }
}

export async function getVehicle(ctx: ShopContext, id: string): Promise<VehicleDto> {
  const v = await Vehicle.findOne({ where: { id, shopId: ctx.shopId } });
  if (!v) throw notFound('That machine');
  return toVehicleDto(v);
}

export async function updateVehicle(ctx: ShopContext, id: string, input: VehicleInput): Promise<VehicleDto> {
  const v = await Vehicle.findOne({ where: { id, shopId: ctx.shopId } });
  if (!v) throw notFound('That machine');
  try {
    await v.update(input);
  } catch (e) {
    if (e instanceof UniqueConstraintError) throw duplicateLabel(input.label);
    throw e;
  }
  await audit({ shopId: ctx.shopId, userId: ctx.userId, action: 'vehicle.updated', entity: 'vehicle', entityId: v.id });
  return toVehicleDto(v);
}
