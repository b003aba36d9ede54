import { queryOptions, useQuery, useQueryClient } from '@tanstack/react-query';
import type { Me } from '@shared/schema/auth';
import type { Area, Permission, Role } from '@shared/schema/role-names';
import { AREA_ROLES, hasAnyRole, may } from '@shared/schema/role-names';
import { api, setCsrfToken } from './api-client';

/** The signed-in person, or null when signed out. */
export const meQuery = queryOptions({
  queryKey: ['auth', 'me'] as const,
  queryFn: async (): Promise<Me | null> => {
    // answers { user: null } when nobody is signed in: no failed request on the sign-in page
    const answer = await api.get<Me | { user: null }>('/api/auth/session');
    return answer.user ? (answer as Me) : null;
  },
  staleTime: 5 * 60_000,
});

export interface Session {
  me: Me | null;
  isLoading: boolean;
  roles: Role[];
  shopName: string;
  can(area: Area): boolean;
  /** The server's permission policy, for showing only what the member may do. */
  may(permission: Permission): boolean;
}

export function useSession(): Session {
  const { data, isLoading } = useQuery(meQuery);
  const me = data ?? null;
  const shop = me?.shops.find((s) => s.id === me.currentShopId);
  const roles = shop?.roles ?? [];
  return { me, isLoading, roles, shopName: shop?.name ?? '', can: (area) => hasAnyRole(roles, AREA_ROLES[area]), may: (p) => may(roles, p) };
}

export function useSignOut(): () => Promise<void> {
  const qc = useQueryClient();
  return async () => {
    try {
      await api.post('/api/auth/logout');
    } finally {
      // the service worker keeps the last /api/auth/session answer for offline reloads; a shared
      // phone must not show the previous person as signed in
      if (typeof caches !== 'undefined') await caches.delete('sw-session').catch(() => false);
      setCsrfToken(null);
      qc.clear();
      qc.setQueryData(meQuery.queryKey, null);
    }
  };
}

export function useSwitchShop(): (shopId: string) => Promise<void> {
  const qc = useQueryClient();
  return async (shopId) => {
    const me = await api.post<Me>('/api/auth/shop', { shopId });
    qc.clear();
    qc.setQueryData(meQuery.queryKey, me);
  };
}

/** The first area a person with these roles would want to land in. */
export function homeFor(roles: Role[]): string {
  const order: Area[] = ['bench', 'drafting', 'debrief', 'shop'];
  const area = order.find((a) => hasAnyRole(roles, AREA_ROLES[a]));
  return area ? `/${area}` : '/no-access';
}
