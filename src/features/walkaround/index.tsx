import { Route, Routes } from 'react-router-dom';
import { RecordPage } from './components/record-page';
import { RoutineEditor } from './components/routine-editor';
import { SignScreen } from './components/sign-screen';
import { StartScreen } from './components/start-screen';
import { TagPage } from './components/tag-page';
import { WalkScreen } from './components/walk-screen';
import { OfflinePanel, OfflineSync } from './offline/offline-panel';

/** Walkaround: start, walk the routine, sign, print the record and the tag. Mounted at /walkaround/*. */
export default function Walkaround() {
  return (
    <>
      <OfflineSync />
      <OfflinePanel />
      <Routes>
        <Route index element={<StartScreen />} />
        <Route path="inspections/:id" element={<WalkScreen />} />
        <Route path="inspections/:id/sign" element={<SignScreen />} />
        <Route path="inspections/:id/record" element={<RecordPage />} />
        <Route path="units/:unitId/tag" element={<TagPage />} />
        <Route path="routines/:unitTypeKey" element={<RoutineEditor />} />
        <Route
          path="*"
          element={
            <p role="alert" className="text-xl">
              No such walkaround page.
            </p>
          }
        />
      </Routes>
    </>
  );
}
