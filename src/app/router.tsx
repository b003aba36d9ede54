import { lazy, Suspense, type ReactNode } from 'react';
import { createBrowserRouter } from 'react-router-dom';
import { AppShell } from './layouts/app-shell';
import { Spinner } from '../components/ui/card';
import { RequireSession, AreaGate, HomeRedirect, NotFound, NoAccess } from './routes/guards';

// Each area is its own chunk: the Bench on a phone never downloads the editor or the charts.
const BenchArea = lazy(() => import('../features/bench/area'));
const DraftingArea = lazy(() => import('../features/drafting/area'));
const DebriefArea = lazy(() => import('../features/debrief/area'));
const ShopArea = lazy(() => import('../features/shop/area'));
// Signed-out pages carry the form libraries; a signed-in phone never needs them.
const SignInPage = lazy(() => import('../features/auth/sign-in-page').then((m) => ({ default: m.SignInPage })));
const ForgotPasswordPage = lazy(() => import('../features/auth/password-pages').then((m) => ({ default: m.ForgotPasswordPage })));
const ResetPasswordPage = lazy(() => import('../features/auth/password-pages').then((m) => ({ default: m.ResetPasswordPage })));
const InvitationPage = lazy(() => import('../features/auth/invitation-page').then((m) => ({ default: m.InvitationPage })));

function Page({ children }: { children: ReactNode }) {
  return <Suspense fallback={<Spinner label="Opening" />}>{children}</Suspense>;
}

export const router = createBrowserRouter([
  { path: '/sign-in', element: <Page><SignInPage /></Page> },
  { path: '/forgot-password', element: <Page><ForgotPasswordPage /></Page> },
  { path: '/reset-password', element: <Page><ResetPasswordPage /></Page> },
  { path: '/invitation', element: <Page><InvitationPage /></Page> },
  {
    element: <RequireSession><AppShell /></RequireSession>,
    children: [
      { index: true, element: <HomeRedirect /> },
      { path: 'bench/*', element: <AreaGate area="bench"><BenchArea /></AreaGate> },
      { path: 'drafting/*', element: <AreaGate area="drafting"><DraftingArea /></AreaGate> },
      { path: 'debrief/*', element: <AreaGate area="debrief"><DebriefArea /></AreaGate> },
      { path: 'shop/*', element: <AreaGate area="shop"><ShopArea /></AreaGate> },
      { path: 'no-access', element: <NoAccess /> },
      { path: '*', element: <NotFound /> },
    ],
  },
]);
