// The demo railroad: invented from end to end (railroad, yards, people, road numbers).
export const DEMO_PASSWORD = 'hoodline-demo';

export const DEMO_RAILROAD = { name: 'Hollins Ridge & Lakeshore Railroad', reportingMark: 'HRL', timeZone: 'America/Chicago' };

export const DEMO_YARDS = [
  { code: 'MRL', name: 'Marlow Yard' },
  { code: 'BTJ', name: 'Bittern Junction' },
] as const;

export const DEMO_PEOPLE = [
  { email: 'inspector@demo.example', name: 'Dana Okafor', role: 'inspector', yard: 'MRL' },
  { email: 'foreman@demo.example', name: 'Ray Lindqvist', role: 'foreman', yard: 'MRL' },
  { email: 'engineer@demo.example', name: 'Priya Raman', role: 'engineer', yard: null },
  { email: 'trainer@demo.example', name: 'Tom Baptiste', role: 'trainer', yard: null },
  { email: 'admin@demo.example', name: 'Ines Carvalho', role: 'admin', yard: null },
  { email: 'l.ferreira@demo.example', name: 'Luis Ferreira', role: 'inspector', yard: 'BTJ' },
  { email: 'm.achterberg@demo.example', name: 'Mae Achterberg', role: 'foreman', yard: 'BTJ' },
] as const;

export const DEMO_UNIT_TYPES = [
  { key: 'six_axle_road', name: 'Six-axle road unit, cab on short hood', file: 'six_axle_road.svg' },
  { key: 'four_axle_road', name: 'Four-axle road unit, cab on short hood', file: 'four_axle_road.svg' },
  { key: 'four_axle_switcher', name: 'Four-axle end-cab yard switcher', file: 'four_axle_switcher.svg' },
] as const;

type FrontEnd = 'short_hood' | 'long_hood';
export const DEMO_UNITS: { roadNumber: string; type: string; frontEnd: FrontEnd; yard: string; cm?: boolean; hump?: boolean }[] = [
  { roadNumber: 'HRL 4101', type: 'six_axle_road', frontEnd: 'short_hood', yard: 'MRL' },
  { roadNumber: 'HRL 4102', type: 'six_axle_road', frontEnd: 'short_hood', yard: 'MRL', cm: true },
  { roadNumber: 'HRL 4103', type: 'six_axle_road', frontEnd: 'long_hood', yard: 'MRL' },
  { roadNumber: 'HRL 4104', type: 'six_axle_road', frontEnd: 'short_hood', yard: 'BTJ' },
  { roadNumber: 'HRL 4105', type: 'six_axle_road', frontEnd: 'long_hood', yard: 'BTJ' },
  { roadNumber: 'HRL 2201', type: 'four_axle_road', frontEnd: 'short_hood', yard: 'MRL' },
  { roadNumber: 'HRL 2202', type: 'four_axle_road', frontEnd: 'long_hood', yard: 'MRL' },
  { roadNumber: 'HRL 2203', type: 'four_axle_road', frontEnd: 'short_hood', yard: 'BTJ' },
  { roadNumber: 'HRL 2204', type: 'four_axle_road', frontEnd: 'short_hood', yard: 'BTJ' },
  { roadNumber: 'HRL 1301', type: 'four_axle_switcher', frontEnd: 'short_hood', yard: 'MRL', hump: true },
  { roadNumber: 'HRL 1302', type: 'four_axle_switcher', frontEnd: 'long_hood', yard: 'MRL' },
  { roadNumber: 'HRL 1303', type: 'four_axle_switcher', frontEnd: 'short_hood', yard: 'BTJ' },
];
