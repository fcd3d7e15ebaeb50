import { lazy } from 'react';
import { createBrowserRouter } from 'react-router-dom';
import { AccountPage } from '../features/account/account-page';
import { LoginPage } from '../features/auth/components/login-page';
import { PeoplePage } from '../features/people/components/people-page';
import { RequireCap } from './guard';
import { Home, NotFound } from './home';
import { Shell } from './shell';

// Feature screens load on demand so the first screen stays small (Konva loads only with the canvas screens).
const Walkaround = lazy(() => import('../features/walkaround'));
const Repairs = lazy(() => import('../features/repairs'));
const DueBoard = lazy(() => import('../features/due-board'));
const Units = lazy(() => import('../features/units'));
const HotSpots = lazy(() => import('../features/hot-spots'));
const Lab = lazy(() => import('../features/orientation-lab'));
const Outbox = lazy(() => import('../features/outbox'));
const Admin = lazy(() => import('../features/admin'));

export const router = createBrowserRouter([
  { path: '/sign-in', element: <LoginPage /> },
  {
    path: '/',
    element: <Shell />,
    children: [
      { index: true, element: <Home /> },
      { path: 'account', element: <AccountPage /> },
      { path: 'people', element: <RequireCap cap="administer"><PeoplePage /></RequireCap> },
      { path: 'walkaround/*', element: <RequireCap cap="inspect"><Walkaround /></RequireCap> },
      { path: 'repairs/*', element: <RequireCap cap="readRecords"><Repairs /></RequireCap> },
      { path: 'due/*', element: <RequireCap cap="readRecords"><DueBoard /></RequireCap> },
      { path: 'units/*', element: <RequireCap cap="readRecords"><Units /></RequireCap> },
      { path: 'hot-spots/*', element: <RequireCap cap="readFleet"><HotSpots /></RequireCap> },
      { path: 'lab/*', element: <RequireCap cap="takeQuiz"><Lab /></RequireCap> },
      { path: 'outbox/*', element: <RequireCap cap="readOutbox"><Outbox /></RequireCap> },
      { path: 'railroad/*', element: <RequireCap cap="administer"><Admin /></RequireCap> },
      { path: '*', element: <NotFound /> },
    ],
  },
]);
