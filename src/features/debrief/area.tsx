import { Routes, Route } from 'react-router-dom';
import { PageHeader, EmptyState } from '../../components/ui/card';

/** The Debrief area; its pages are being built. */
export default function DebriefArea() {
  return (
    <Routes>
      <Route index element={<><PageHeader title="Debrief" /><EmptyState title="Debrief is on its way" /></>} />
    </Routes>
  );
}
