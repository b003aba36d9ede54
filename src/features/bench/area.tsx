import { Routes, Route } from 'react-router-dom';
import { PageHeader, EmptyState } from '../../components/ui/card';

/** The Bench area; its pages are being built. */
export default function BenchArea() {
  return (
    <Routes>
      <Route index element={<><PageHeader title="Bench" /><EmptyState title="Bench is on its way" /></>} />
    </Routes>
  );
}
