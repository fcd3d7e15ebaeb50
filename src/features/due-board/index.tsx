import { Route, Routes } from 'react-router-dom';
import { DueBoardPage } from './components/due-board-page';

/** Screen entry, lazy-loaded by the router at /due/*. */
export default function DueBoardScreen() {
  return (
    <Routes>
      <Route index element={<DueBoardPage />} />
    </Routes>
  );
}
