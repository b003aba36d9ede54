import { NavLink, Navigate, Route, Routes } from 'react-router-dom';
import { cx } from '../../components/ui/cx';
import { MembersPage } from './components/members-page';
import { VehiclesPage } from './components/vehicles-page';
import { SettingsPage } from './components/settings-page';
import { MailPage } from './components/mail-page';

const TABS = [
  { to: 'members', label: 'Members' },
  { to: 'machines', label: 'Machines' },
  { to: 'settings', label: 'Settings' },
  { to: 'mail', label: 'Mail sent' },
];

/** Shop administration: members and invitations, machines, settings and meters, the mailbox. */
export default function ShopArea() {
  return (
    <div className="flex flex-col gap-4">
      <nav aria-label="Shop" className="flex flex-wrap gap-2 border-b border-line pb-2">
        {TABS.map((t) => (
          <NavLink key={t.to} to={t.to} className={({ isActive }) => cx('min-h-11 rounded-md px-4 py-2 font-semibold', isActive ? 'bg-ink text-white' : 'hover:bg-ink/5')}>
            {t.label}
          </NavLink>
        ))}
      </nav>
      <Routes>
        <Route index element={<Navigate to="members" replace />} />
        <Route path="members" element={<MembersPage />} />
        <Route path="machines" element={<VehiclesPage />} />
        <Route path="settings" element={<SettingsPage />} />
        <Route path="mail" element={<MailPage />} />
      </Routes>
    </div>
  );
}
