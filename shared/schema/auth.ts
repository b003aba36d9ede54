import { z } from 'zod';
import { RoleSchema } from './roles';

const email = z.string().trim().toLowerCase().email('Enter an e-mail address such as name@shop.test');
/** At least 10 characters: long beats clever (NIST SP 800-63B asks for at least 8). */
export const PasswordSchema = z.string().min(10, 'Use at least 10 characters').max(200, 'Use at most 200 characters');

export const LoginInput = z.object({ email, password: z.string().min(1, 'Enter your password') });
export type LoginInput = z.infer<typeof LoginInput>;

export const SwitchShopInput = z.object({ shopId: z.string().uuid('Pick a shop from the list') });

export const ForgotPasswordInput = z.object({ email });
export const ResetPasswordInput = z.object({ token: z.string().min(10, 'The link is incomplete'), password: PasswordSchema });

export const AcceptInvitationInput = z.object({
  token: z.string().min(10, 'The link is incomplete'),
  name: z.string().trim().min(1, 'Enter your name').max(120),
  password: PasswordSchema,
});
export type AcceptInvitationInput = z.infer<typeof AcceptInvitationInput>;

export const InviteInput = z.object({
  email,
  name: z.string().trim().max(120).default(''),
  roles: z.array(RoleSchema).min(1, 'Pick at least one role'),
});
export type InviteInput = z.infer<typeof InviteInput>;

export const UpdateRolesInput = z.object({ roles: z.array(RoleSchema).min(1, 'Pick at least one role') });

export interface ShopSummary {
  id: string; name: string; roles: z.infer<typeof RoleSchema>[];
  /** The shop's BCP 47 locale for dates and numbers; null: follow the browser. */
  locale: string | null;
}
export interface Me {
  user: { id: string; email: string; name: string };
  shops: ShopSummary[];
  currentShopId: string | null;
}
