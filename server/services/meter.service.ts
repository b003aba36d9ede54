import { UniqueConstraintError } from 'sequelize';
import type { ShopContext } from '../auth/context';
import { Meter } from '../models';
import { AppError } from '../lib/errors';
import type { MeterDto, MeterInput } from '@shared/schema/shop';

export async function listMeters(ctx: ShopContext): Promise<MeterDto[]> {
  const rows = await Meter.findAll({ where: { shopId: ctx.shopId }, order: [['name', 'ASC']] });
  // Stored only through MeterInput, so each entry names a reading quantity.
  return rows.map((m) => ({ id: m.id, name: m.name, spec: m.spec as MeterDto['spec'] }));
}

export async function createMeter(ctx: ShopContext, input: MeterInput) {
  try {
    const m = await Meter.create({ shopId: ctx.shopId, name: input.name, spec: input.spec });
    return { id: m.id, name: m.name, spec: m.spec };
  } catch (e) {
    if (e instanceof UniqueConstraintError) {
      throw new AppError(409, 'duplicate', `A meter named "${input.name}" already exists. Use another name.`, [{ path: 'name', message: 'Already used' }]);
    }
    throw e;
  }
}
