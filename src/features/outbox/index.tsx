import { Route, Routes } from 'react-router-dom';
import { OutboxPage } from './components/outbox-page';

/** Screen entry, lazy-loaded by the router at /outbox/*. */
export default function OutboxScreen() {
  return (
    <Routes>
      <Route index element={<OutboxPage />} />
    </Routes>
  );
}
