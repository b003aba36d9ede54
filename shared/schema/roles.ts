import { z } from 'zod';
import { ROLES } from './role-names';

export { ROLES, AREA_ROLES, hasAnyRole, type Role, type Area } from './role-names';
export const RoleSchema = z.enum(ROLES);
