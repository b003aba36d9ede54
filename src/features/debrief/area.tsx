import { NavLink, Route, Routes } from 'react-router-dom';
import { cx } from '../../components/ui/cx';
import { DiagnosesPage } from './components/diagnoses-page';
import { ReplayPage } from './components/replay-page';
import { AnalyticsPage } from './components/analytics-page';

const tab = ({ isActive }: { isActive: boolean }) =>
  cx('min-h-11 inline-flex items-center rounded-lg px-4 font-semibold', isActive ? 'bg-ink text-white' : 'text-ink hover:bg-ink/5');

/** Debrief: the trainers' and leads' area (diagnoses, one diagnosis replayed, procedure analytics). */
export default function DebriefArea() {
  return (
    <div className="mx-auto flex max-w-[96rem] flex-col">
      <nav aria-label="Debrief" className="mb-4 flex gap-2">
        <NavLink to="/debrief" end className={tab}>Diagnoses</NavLink>
        <NavLink to="/debrief/analytics" className={tab}>Procedure analytics</NavLink>
      </nav>
      <Routes>
        <Route index element={<DiagnosesPage />} />
        <Route path="diagnoses/:id" element={<ReplayPage />} />
        <Route path="analytics" element={<AnalyticsPage />} />
      </Routes>
    </div>
  );
}
