import { Route, Routes } from 'react-router-dom';
import { FindingPage } from './components/finding-page';
import { QueuePage } from './components/queue-page';

/** Screen entry, lazy-loaded by the router at /repairs/*. */
export default function RepairsScreen() {
  return (
    <Routes>
      <Route index element={<QueuePage />} />
      <Route path="findings/:id" element={<FindingPage />} />
    </Routes>
  );
}
