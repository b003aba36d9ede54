import { z } from 'zod';
import { ROLES } from './role-names';

export { ROLES, AREA_ROLES, PERMISSIONS, hasAnyRole, may, readsDiagnoses, type Role, type Area, type Permission } from './role-names';
export const RoleSchema = z.enum(ROLES);
