import { lazy, Suspense } from 'react';
import { Routes, Route } from 'react-router-dom';
import { Spinner } from '../../components/ui/card';
import { ProcedureListPage } from './components/procedure-list-page';

// The canvas (React Flow) and its panels are a chunk of their own: the list never loads them.
const EditorPage = lazy(() => import('./components/editor/editor-page'));

/** Drafting: the procedure list and the editor. */
export default function DraftingArea() {
  return (
    <Routes>
      <Route index element={<ProcedureListPage />} />
      <Route path=":procedureId/versions/:versionId" element={<Suspense fallback={<Spinner label="Loading the editor" />}><EditorPage /></Suspense>} />
    </Routes>
  );
}
