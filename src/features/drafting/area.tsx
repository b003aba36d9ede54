import { lazy, Suspense, useEffect } from 'react';
import { Routes, Route, useParams } from 'react-router-dom';
import { useQueryClient } from '@tanstack/react-query';
import { Spinner } from '../../components/ui/card';
import { ProcedureListPage } from './components/procedure-list-page';
import { draftingQueries } from './api/queries';

// The canvas (React Flow) and its panels are a chunk of their own: the list never loads them.
const loadEditor = () => import('./components/editor/editor-page');
const EditorPage = lazy(loadEditor);

/** Starts the version's requests while the editor chunk downloads, instead of after it. */
function EditorRoute() {
  const { procedureId = '', versionId = '' } = useParams();
  const qc = useQueryClient();
  useEffect(() => {
    void qc.prefetchQuery(draftingQueries.procedure(procedureId));
    void qc.prefetchQuery(draftingQueries.version(procedureId, versionId));
  }, [qc, procedureId, versionId]);
  return <Suspense fallback={<Spinner label="Loading the editor" />}><EditorPage /></Suspense>;
}

/** Drafting: the procedure list and the editor. */
export default function DraftingArea() {
  // an author on the list will most likely open the editor next: fetch its code while idle
  useEffect(() => { const t = setTimeout(() => void loadEditor(), 1500); return () => clearTimeout(t); }, []);
  return (
    <Routes>
      <Route index element={<ProcedureListPage />} />
      <Route path=":procedureId/versions/:versionId" element={<EditorRoute />} />
    </Routes>
  );
}
