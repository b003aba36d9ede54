import { queryOptions } from '@tanstack/react-query';
import type { Role } from '@shared/schema/roles';
import type { VehicleDto } from '@shared/schema/vehicle';
import { api, qs } from '../../../lib/api-client';

export interface MemberRow { id: string; userId: string; email: string; name: string; roles: Role[]; since: string; disabled: boolean }
export interface InvitationRow { id: string; email: string; name: string; roles: Role[]; createdAt: string; expiresAt: string; state: 'open' | 'accepted' | 'expired' }
export interface MailRow { id: number; receivedAt: string; to: string[]; subject: string; text: string }
export interface ShopSettingsDto { name: string; settings: { comebackDays: number; abandonAfterHours: number; serviceDeskEmail: string }; locale: string | null }
export interface MeterRow { id: string; name: string; spec: { entries: { quantity: string; percentOfReading: number; counts: number; resolution: number }[] } }

export const shopKeys = {
  all: ['shop'] as const,
  members: () => [...shopKeys.all, 'members'] as const,
  invitations: () => [...shopKeys.all, 'invitations'] as const,
  vehicles: (q = '') => [...shopKeys.all, 'vehicles', q] as const,
  settings: () => [...shopKeys.all, 'settings'] as const,
  meters: () => [...shopKeys.all, 'meters'] as const,
  mail: () => [...shopKeys.all, 'mail'] as const,
};

export const shopQueries = {
  members: () => queryOptions({ queryKey: shopKeys.members(), queryFn: () => api.get<MemberRow[]>('/api/shop/members') }),
  invitations: () => queryOptions({ queryKey: shopKeys.invitations(), queryFn: () => api.get<InvitationRow[]>('/api/shop/invitations') }),
  vehicles: (q = '') => queryOptions({ queryKey: shopKeys.vehicles(q), queryFn: () => api.get<VehicleDto[]>(`/api/vehicles${qs({ q })}`) }),
  settings: () => queryOptions({ queryKey: shopKeys.settings(), queryFn: () => api.get<ShopSettingsDto>('/api/shop/settings') }),
  meters: () => queryOptions({ queryKey: shopKeys.meters(), queryFn: () => api.get<MeterRow[]>('/api/shop/meters') }),
  mail: () => queryOptions({ queryKey: shopKeys.mail(), queryFn: () => api.get<MailRow[]>('/api/shop/mail'), refetchInterval: 5000 }),
};
