import type { AppDeps } from '../deps';
import { Shop, User, Membership, Vehicle, Meter } from '../models';
import { hashPassword } from '../lib/passwords';
import type { Role } from '@shared/schema/roles';
import { seedDemoProcedures } from './demo-procedures';
import { seedHistoryIfEmpty } from './history';

// The invented demo scenario: a rental fleet serviced by one shop, and a second shop of the
// same dealer group that the trainer also covers. Every name here is made up.
export const DEMO_SHOP = { slug: 'larkspur-lane', name: 'Larkspur Lane Powersports' };
export const DEMO_SISTER_SHOP = { slug: 'larkspur-harbour', name: 'Larkspur Harbour Road Service' };

export const DEMO_ACCOUNTS: { email: string; name: string; roles: Role[]; sister?: Role[] }[] = [
  { email: 'admin@larkspur.test', name: 'Avery Admin', roles: ['admin'] },
  { email: 'author@larkspur.test', name: 'Morgan Author', roles: ['author'] },
  { email: 'lead@larkspur.test', name: 'Rowan Lead', roles: ['lead'] },
  { email: 'tech@larkspur.test', name: 'Casey Tech', roles: ['technician'] },
  { email: 'trainer@larkspur.test', name: 'Jordan Trainer', roles: ['trainer'], sister: ['trainer'] },
];

const DEMO_VEHICLES = [
  { label: 'W-01', model: 'Wren 50 two-stroke scooter', frameNumber: 'WRN50-00417', hours: 312.5 },
  { label: 'W-02', model: 'Wren 50 two-stroke scooter', frameNumber: 'WRN50-00422', hours: 288.0 },
  { label: 'W-03', model: 'Wren 50 two-stroke scooter', frameNumber: 'WRN50-00431', hours: 140.0 },
  { label: 'B-01', model: 'Badger 110 youth quad', frameNumber: 'BDG110-2291', hours: 96.0 },
  { label: 'B-02', model: 'Badger 110 youth quad', frameNumber: 'BDG110-2307', hours: 121.5 },
  { label: 'H-01', model: 'Heron 125 pit bike', frameNumber: 'HRN125-7713', hours: 58.0 },
  { label: 'H-02', model: 'Heron 125 pit bike', frameNumber: 'HRN125-7720', hours: 73.5 },
];

// Illustrative meter specs in the usual ±(% of reading + counts) form; not any real meter.
const DEMO_METERS = [
  {
    name: 'Bench meter 1',
    spec: {
      entries: [
        { quantity: 'resistance', percentOfReading: 0.9, counts: 2, resolution: 0.1 },
        { quantity: 'dc-voltage', percentOfReading: 0.5, counts: 2, resolution: 0.01 },
        { quantity: 'ac-voltage', percentOfReading: 1.0, counts: 3, resolution: 0.1 },
        { quantity: 'capacitance', percentOfReading: 3.0, counts: 5, resolution: 1e-9 },
      ],
    },
  },
  {
    name: 'Yard meter with peak-voltage adapter',
    spec: {
      entries: [
        { quantity: 'resistance', percentOfReading: 1.2, counts: 3, resolution: 0.1 },
        { quantity: 'peak-voltage', percentOfReading: 3.0, counts: 5, resolution: 1 },
        { quantity: 'dc-voltage', percentOfReading: 0.8, counts: 3, resolution: 0.01 },
      ],
    },
  },
];

/** Creates the demo shop, accounts, fleet and procedures when missing; never touches existing rows. */
export async function seedDemo(deps: AppDeps): Promise<{ shopName: string; accounts: { email: string; roles: Role[] }[] }> {
  const passwordHash = await hashPassword(deps.config.DEMO_PASSWORD);
  await deps.sequelize.transaction(async (transaction) => {
    const [shop] = await Shop.findOrCreate({
      where: { slug: DEMO_SHOP.slug },
      defaults: { ...DEMO_SHOP, settings: { comebackDays: 30, abandonAfterHours: 24, serviceDeskEmail: 'desk@larkspur.test' } },
      transaction,
    });
    const [sister] = await Shop.findOrCreate({
      where: { slug: DEMO_SISTER_SHOP.slug },
      defaults: { ...DEMO_SISTER_SHOP, settings: { comebackDays: 30, abandonAfterHours: 24, serviceDeskEmail: '' } },
      transaction,
    });
    for (const a of DEMO_ACCOUNTS) {
      const [user] = await User.findOrCreate({ where: { email: a.email }, defaults: { email: a.email, name: a.name, passwordHash }, transaction });
      await Membership.findOrCreate({ where: { shopId: shop.id, userId: user.id }, defaults: { shopId: shop.id, userId: user.id, roles: a.roles }, transaction });
      if (a.sister) {
        await Membership.findOrCreate({ where: { shopId: sister.id, userId: user.id }, defaults: { shopId: sister.id, userId: user.id, roles: a.sister }, transaction });
      }
    }
    for (const v of DEMO_VEHICLES) {
      await Vehicle.findOrCreate({ where: { shopId: shop.id, label: v.label }, defaults: { ...v, shopId: shop.id }, transaction });
    }
    for (const m of DEMO_METERS) {
      await Meter.findOrCreate({ where: { shopId: shop.id, name: m.name }, defaults: { ...m, shopId: shop.id }, transaction });
    }
    const lead = await User.findOne({ where: { email: 'lead@larkspur.test' }, transaction });
    await seedDemoProcedures(shop.id, transaction, lead?.id ?? null);
  });
  // A few hundred invented diagnoses so Debrief is never empty on first run; tests seed their own.
  if (deps.config.DEMO_HISTORY > 0) {
    await seedHistoryIfEmpty(deps, (await Shop.findOne({ where: { slug: DEMO_SHOP.slug } }))!.id, deps.config.DEMO_HISTORY);
  }
  return { shopName: DEMO_SHOP.name, accounts: DEMO_ACCOUNTS.map(({ email, roles }) => ({ email, roles })) };
}
