import { useEffect } from 'react';
import { Routes, Route } from 'react-router-dom';
import { startOutbox } from '../../lib/offline/outbox';
import { BenchHome } from './components/bench-home';
import { StartPage } from './components/start-page';
import { DiagnosisScreen } from './components/diagnosis-screen';
import { RecordPage } from './components/record-page';
import { JobCardPage } from './components/job-card-page';

/** The Bench: the technician's phone-first area. Stepping works from IndexedDB, offline. */
/** The app shell's service worker (vite-plugin-pwa), so an open diagnosis survives a reload without signal. */
function registerWorker(): void {
  if (!import.meta.env.PROD || !('serviceWorker' in navigator)) return;
  navigator.serviceWorker.register('/sw.js', { scope: '/' }).catch(() => undefined); // offline use is a bonus, never a blocker
}

export default function BenchArea() {
  useEffect(() => {
    registerWorker();
    startOutbox();
  }, []);
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
