import { useEffect } from 'react';
import { Routes, Route } from 'react-router-dom';
import { startOutbox } from '../../lib/offline/outbox';
import { BenchHome } from './components/bench-home';
import { StartPage } from './components/start-page';
import { DiagnosisScreen } from './components/diagnosis-screen';
import { RecordPage } from './components/record-page';
import { JobCardPage } from './components/job-card-page';

/** The Bench: the technician's phone-first area. Stepping works from IndexedDB, offline. */
export default function BenchArea() {
  useEffect(() => startOutbox(), []);
  return (
    <Routes>
      <Route index element={<BenchHome />} />
      <Route path="start" element={<StartPage />} />
      <Route path="job-card" element={<JobCardPage />} />
      <Route path="d/:id" element={<DiagnosisScreen />} />
      <Route path="d/:id/record" element={<RecordPage />} />
    </Routes>
  );
}
