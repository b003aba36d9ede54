import { createContext, useContext, type ReactNode } from 'react';
import { useQuery } from '@tanstack/react-query';
import { localeFormat, type LocaleFormat } from '@shared/format/locale';
import { meQuery } from './session';

// The browser's own locale until the session says the shop chose one (and outside the app's
// providers, e.g. in component tests).
const FormatContext = createContext<LocaleFormat>(localeFormat(null));

/** The current shop's locale, from the session: null follows the browser. */
export function useShopLocale(): string | null {
  const { data } = useQuery(meQuery);
  return data?.shops.find((s) => s.id === data.currentShopId)?.locale ?? null;
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
