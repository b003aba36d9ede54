import { createContext, useContext, useSyncExternalStore, type ReactNode } from 'react';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import { localeFormat, type LocaleFormat } from '@shared/format/locale';
import { meQuery } from './session';

// The browser's own locale until the session says the shop chose one (and outside the app's
// providers, e.g. in component tests).
const FormatContext = createContext<LocaleFormat>(localeFormat(null));

/** The current shop's locale, from the session: null follows the browser. */
export function useShopLocale(): string | null {
  const qc = useQueryClient();
  useQuery(meQuery); // asks for the session when nobody has yet
  // Read from the cache, not from the observer: sign-in and a shop switch clear the cache and put
  // a new session in, which an observer above the router (never re-rendered) would not see.
  return useSyncExternalStore(
    (changed) => qc.getQueryCache().subscribe(changed),
    () => {
      const me = qc.getQueryData(meQuery.queryKey);
      return me?.shops.find((s) => s.id === me.currentShopId)?.locale ?? null;
    },
  );
}

/**
 * Provides the shop's formatter once for the whole app, so that a screen (the Bench's steps above
 * all) reads it from context instead of each asking the session and building Intl formatters.
 */
export function FormatProvider({ children }: { children: ReactNode }) {
  const locale = useShopLocale();
  return <FormatContext.Provider value={localeFormat(locale)}>{children}</FormatContext.Provider>;
}

/** Dates, times, counts, shares and readings in the shop's locale: `useFormat().time(iso)`. */
export function useFormat(): LocaleFormat {
  return useContext(FormatContext);
}
