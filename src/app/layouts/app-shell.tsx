import { NavLink, Outlet, useNavigate } from 'react-router-dom';
import type { Area } from '@shared/schema/role-names';
import { useSession, useSignOut, useSwitchShop, type Session } from '../../lib/session';
import { Logo } from '../../components/logo';
import { cx } from '../../components/ui/cx';

const AREAS: { area: Area; label: string; hint: string }[] = [
  { area: 'bench', label: 'Bench', hint: 'Diagnose a machine' },
  { area: 'drafting', label: 'Drafting', hint: 'Draw procedures' },
  { area: 'debrief', label: 'Debrief', hint: 'Review and coach' },
  { area: 'shop', label: 'Shop', hint: 'Members and machines' },
];

type AreaLink = (typeof AREAS)[number];

function AreaNav({ areas }: { areas: AreaLink[] }) {
  return (
    <nav aria-label="Areas" className="order-3 w-full overflow-x-auto sm:order-none sm:w-auto">
      <ul className="flex gap-1">
        {areas.map((a) => (
          <li key={a.area}>
            <NavLink
              to={`/${a.area}`}
              title={a.hint}
              className={({ isActive }) => cx(
                'flex min-h-11 items-center rounded-md px-3 text-base font-semibold',
                isActive ? 'bg-white/10 text-white shadow-[inset_0_-3px_0_#f08a24]' : 'text-white/80 hover:bg-white/10 hover:text-white',
              )}
            >
              {a.label}
            </NavLink>
          </li>
        ))}
      </ul>
    </nav>
  );
}

interface AccountProps {
  me: Session['me'];
  shopName: string;
  onSwitchShop: (shopId: string) => void;
  onSignOut: () => void;
}

/** The shop (a picker for people in several shops), who is signed in, and sign-out. */
function Account({ me, shopName, onSwitchShop, onSignOut }: AccountProps) {
  return (
    <div className="ml-auto flex items-center gap-2">
      {me && me.shops.length > 1 ? (
        <label className="flex items-center gap-2 text-sm">
          <span className="sr-only">Shop</span>
          <select
            value={me.currentShopId ?? ''}
            onChange={(e) => onSwitchShop(e.target.value)}
            className="min-h-10 max-w-48 rounded-md border border-white/30 bg-ink px-2 text-white"
          >
            {me.shops.map((s) => <option key={s.id} value={s.id}>{s.name}</option>)}
          </select>
        </label>
      ) : (
        <span className="hidden text-sm text-white/80 md:inline">{shopName}</span>
      )}
      <span className="hidden text-sm text-white/80 lg:inline" aria-label="Signed in as">{me?.user.name}</span>
      <button
        type="button"
        onClick={onSignOut}
        className="min-h-10 rounded-md border border-white/30 px-3 text-sm font-semibold hover:bg-white/10"
      >
        Sign out
      </button>
    </div>
  );
}

/** The frame around every signed-in page: the areas this person may use, the shop, sign-out. */
export function AppShell() {
  const { me, can, shopName } = useSession();
  const signOut = useSignOut();
  const switchShop = useSwitchShop();
  const navigate = useNavigate();
  const areas = AREAS.filter((a) => can(a.area));
  return (
    <div className="flex min-h-dvh flex-col">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:rounded focus:bg-panel focus:p-2">Skip to content</a>
      <header className="no-print bg-ink text-white">
        <div className="mx-auto flex max-w-[1600px] flex-wrap items-center gap-x-4 gap-y-2 px-3 py-2 sm:px-5">
          <NavLink to="/" className="flex items-center gap-2 text-xl font-black tracking-tight">
            <Logo size={30} />
            <span>Sparkwright</span>
          </NavLink>
          <AreaNav areas={areas} />
          <Account me={me} shopName={shopName}
            onSwitchShop={(shopId) => { void switchShop(shopId).then(() => navigate('/')); }}
            onSignOut={() => { void signOut().then(() => navigate('/sign-in')); }} />
        </div>
      </header>
      <main id="main" className="mx-auto w-full max-w-[1600px] flex-1 px-3 py-4 sm:px-5">
        <Outlet />
      </main>
    </div>
  );
}
