import { createBrowserRouter } from 'react-router-dom';
import { Placeholder } from '../components/placeholder';
import { AccountPage } from '../features/account/account-page';
import { LoginPage } from '../features/auth/components/login-page';
import { PeoplePage } from '../features/people/components/people-page';
import { RequireCap } from './guard';
import { Home, NotFound } from './home';
import { Shell } from './shell';

export const router = createBrowserRouter([
  { path: '/sign-in', element: <LoginPage /> },
  {
    path: '/',
    element: <Shell />,
    children: [
      { index: true, element: <Home /> },
      { path: 'account', element: <AccountPage /> },
      { path: 'people', element: <RequireCap cap="administer"><PeoplePage /></RequireCap> },
      { path: 'walkaround/*', element: <RequireCap cap="inspect"><Placeholder title="Walkaround" what="The walkaround is built by the walkaround work." /></RequireCap> },
      { path: 'repairs', element: <RequireCap cap="readRecords"><Placeholder title="Repair queue" what="The repair queue comes with the repair work." /></RequireCap> },
      { path: 'due', element: <RequireCap cap="readRecords"><Placeholder title="Due board" what="The due board comes with the repair work." /></RequireCap> },
      { path: 'units/*', element: <RequireCap cap="readRecords"><Placeholder title="Units" what="The roster comes with the drawings." /></RequireCap> },
      { path: 'hot-spots', element: <RequireCap cap="readFleet"><Placeholder title="Hot spots" what="Fleet hot spots come with the hot-spots work." /></RequireCap> },
      { path: 'lab/*', element: <RequireCap cap="takeQuiz"><Placeholder title="Orientation lab" what="The lab comes with the training work." /></RequireCap> },
      { path: 'outbox', element: <RequireCap cap="readOutbox"><Placeholder title="Outbox" what="The outbox comes with the walkaround's e-mail." /></RequireCap> },
      { path: '*', element: <NotFound /> },
    ],
  },
]);
