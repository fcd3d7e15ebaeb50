import { Route, Routes } from 'react-router-dom';
import { RosterPage } from './components/roster-page';
import { UnitPage } from './components/unit-page';

/** Units: the roster and each unit's page (drawing, open findings, due items, history). Mounted at /units/*. */
export default function UnitsScreen() {
  return (
    <Routes>
      <Route index element={<RosterPage />} />
      <Route path=":id" element={<UnitPage />} />
      <Route
        path="*"
        element={
          <p role="alert" className="text-xl">
            No such units page.
          </p>
        }
      />
    </Routes>
  );
}
