import { can, type Capability, type Role } from '../../shared/domain/roles';

/** The screens of the product and who sees each; the shell and the home page both read this. */
export interface ScreenDef {
  path: string;
  title: string;
  cap: Capability;
  blurb: string;
}

export const SCREENS: ScreenDef[] = [
  { path: '/walkaround', title: 'Walkaround', cap: 'inspect', blurb: 'Inspect a unit along your routine and pin findings on the drawing.' },
  { path: '/repairs', title: 'Repair queue', cap: 'readRecords', blurb: 'Open findings by yard and unit, non-complying units first.' },
  { path: '/due', title: 'Due board', cap: 'readRecords', blurb: 'Every unit’s inspection and test intervals.' },
  { path: '/units', title: 'Units', cap: 'readRecords', blurb: 'The roster and each unit’s drawing and history.' },
  { path: '/hot-spots', title: 'Hot spots', cap: 'readFleet', blurb: 'Where the fleet keeps failing, drawn front first.' },
  { path: '/lab', title: 'Orientation lab', cap: 'takeQuiz', blurb: 'How front, left, right and the numbers follow the F.' },
  { path: '/people', title: 'People', cap: 'administer', blurb: 'Accounts, roles and locks.' },
  { path: '/outbox', title: 'Outbox', cap: 'readOutbox', blurb: 'E-mail Hoodline has sent or is retrying.' },
  { path: '/railroad', title: 'Railroad', cap: 'administer', blurb: 'Settings and the audit log.' },
];

export const HOME_BY_ROLE: Record<Role, string> = {
  inspector: '/walkaround',
  foreman: '/repairs',
  engineer: '/hot-spots',
  trainer: '/lab',
  admin: '/people',
};

export const screensFor = (role: Role) => SCREENS.filter((s) => can(role, s.cap));
