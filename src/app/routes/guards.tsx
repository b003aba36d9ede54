import { Suspense, type ReactNode } from 'react';
import { Navigate, useLocation } from 'react-router-dom';
import type { Area } from '@shared/schema/role-names';
import { useSession, homeFor } from '../../lib/session';
import { Spinner, EmptyState } from '../../components/ui/card';
import { LinkButton } from '../../components/ui/button';
import { AreaErrorBoundary } from './area-error-boundary';

export function RequireSession({ children }: { children: ReactNode }) {
  const { me, isLoading } = useSession();
  const location = useLocation();
  if (isLoading) return <Spinner label="Opening Sparkwright" />;
  if (!me) return <Navigate to={`/sign-in?next=${encodeURIComponent(location.pathname + location.search)}`} replace />;
  return <>{children}</>;
}

/** Shows an area only to the roles that may use it; the server checks again on every request. */
export function AreaGate({ area, children }: { area: Area; children: ReactNode }) {
  const { can } = useSession();
  const { pathname } = useLocation();
  if (!can(area)) return <NoAccess />;
  return (
    <AreaErrorBoundary area={area} resetKey={pathname}>
      <Suspense fallback={<Spinner label="Loading" />}>{children}</Suspense>
    </AreaErrorBoundary>
  );
}

export function HomeRedirect() {
  const { roles } = useSession();
  return <Navigate to={homeFor(roles)} replace />;
}

export function NoAccess() {
  return (
    <EmptyState title="This area is not part of your role in this shop">
      <p>Ask a shop admin to add the role you need, or switch shop.</p>
      <LinkButton to="/" variant="secondary" className="mt-4">Go to my area</LinkButton>
    </EmptyState>
  );
}

export function NotFound() {
  return (
    <EmptyState title="There is no page at this address">
      <LinkButton to="/" variant="secondary" className="mt-4">Go to my area</LinkButton>
    </EmptyState>
  );
}
