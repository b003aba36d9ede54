import { Routes, Route } from 'react-router-dom';
import { PageHeader, EmptyState } from '../../components/ui/card';

/** The Drafting area; its pages are being built. */
export default function DraftingArea() {
  return (
    <Routes>
      <Route index element={<><PageHeader title="Drafting" /><EmptyState title="Drafting is on its way" /></>} />
    </Routes>
  );
}
