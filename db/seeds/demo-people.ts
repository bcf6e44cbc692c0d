// The invented demo scenario: two brands, three dealer shops and their people.
// Every name here is made up for the demo.
export const DEMO_PASSWORD = 'loadproof-demo';

export type DemoOrg = {
  slug: string;
  kind: 'dealer' | 'brand';
  name: string;
  country: string;
  timeZone: string;
  addressLine: string;
  city: string;
  postcode: string;
  contactEmail: string;
  currency?: string;
  maxLaborRateMinor?: number;
};

export const demoOrganisations: DemoOrg[] = [
  {
    slug: 'torvane', kind: 'brand', name: 'Torvane Drive Systems', country: 'NL', timeZone: 'Europe/Amsterdam',
    addressLine: 'Spoorhaven 14', city: 'Zwolle', postcode: '8011 AB', contactEmail: 'warranty@torvane.test',
    currency: 'EUR', maxLaborRateMinor: 9500,
  },
  {
    slug: 'wrenfield', kind: 'brand', name: 'Wrenfield Bicycle Co.', country: 'US', timeZone: 'America/Denver',
    addressLine: '2200 Larkspur Yard', city: 'Boulder, CO', postcode: '80301', contactEmail: 'claims@wrenfield.test',
    currency: 'USD', maxLaborRateMinor: 12000,
  },
  {
    slug: 'lanternhill', kind: 'dealer', name: 'Lanternhill Cycles', country: 'US', timeZone: 'America/Los_Angeles',
    addressLine: '418 SE Alder Row', city: 'Portland, OR', postcode: '97214', contactEmail: 'service@lanternhill.test',
  },
  {
    slug: 'kettenblatt', kind: 'dealer', name: 'Kettenblatt Radwerk', country: 'DE', timeZone: 'Europe/Berlin',
    addressLine: 'Mühlenweg 7', city: 'Freiburg im Breisgau', postcode: '79098', contactEmail: 'werkstatt@kettenblatt.test',
  },
  {
    slug: 'tidewheel', kind: 'dealer', name: 'Tidewheel Cycles', country: 'CA', timeZone: 'America/Halifax',
    addressLine: '55 Quayside Lane', city: 'Halifax, NS', postcode: 'B3J 1S9', contactEmail: 'shop@tidewheel.test',
  },
];

export type DemoUser = {
  org: string;
  email: string;
  name: string;
  role: 'dealer' | 'dealer_admin' | 'brand_rep' | 'warehouse' | 'accountant' | 'brand_admin';
  units: 'metric' | 'imperial';
  timeZone: string;
};

export const demoUsers: DemoUser[] = [
  { org: 'lanternhill', email: 'sam.okafor@lanternhill.test', name: 'Sam Okafor', role: 'dealer', units: 'imperial', timeZone: 'America/Los_Angeles' },
  { org: 'lanternhill', email: 'rita.vance@lanternhill.test', name: 'Rita Vance', role: 'dealer_admin', units: 'imperial', timeZone: 'America/Los_Angeles' },
  { org: 'kettenblatt', email: 'lena.hartmann@kettenblatt.test', name: 'Lena Hartmann', role: 'dealer', units: 'metric', timeZone: 'Europe/Berlin' },
  { org: 'kettenblatt', email: 'jonas.weber@kettenblatt.test', name: 'Jonas Weber', role: 'dealer_admin', units: 'metric', timeZone: 'Europe/Berlin' },
  { org: 'tidewheel', email: 'theo.marsh@tidewheel.test', name: 'Theo Marsh', role: 'dealer', units: 'metric', timeZone: 'America/Halifax' },
  { org: 'tidewheel', email: 'maya.lindqvist@tidewheel.test', name: 'Maya Lindqvist', role: 'dealer_admin', units: 'metric', timeZone: 'America/Halifax' },
  { org: 'torvane', email: 'priya.nair@torvane.test', name: 'Priya Nair', role: 'brand_rep', units: 'metric', timeZone: 'Europe/Amsterdam' },
  { org: 'torvane', email: 'owen.brandt@torvane.test', name: 'Owen Brandt', role: 'brand_rep', units: 'metric', timeZone: 'Europe/Amsterdam' },
  { org: 'torvane', email: 'felix.moreau@torvane.test', name: 'Felix Moreau', role: 'warehouse', units: 'metric', timeZone: 'Europe/Amsterdam' },
  { org: 'torvane', email: 'hana.sato@torvane.test', name: 'Hana Sato', role: 'accountant', units: 'metric', timeZone: 'Europe/Amsterdam' },
  { org: 'torvane', email: 'diego.alves@torvane.test', name: 'Diego Alves', role: 'brand_admin', units: 'metric', timeZone: 'Europe/Amsterdam' },
  { org: 'wrenfield', email: 'ines.costa@wrenfield.test', name: 'Ines Costa', role: 'brand_rep', units: 'imperial', timeZone: 'America/Denver' },
  { org: 'wrenfield', email: 'tom.reyes@wrenfield.test', name: 'Tom Reyes', role: 'warehouse', units: 'imperial', timeZone: 'America/Denver' },
  { org: 'wrenfield', email: 'ada.kowalski@wrenfield.test', name: 'Ada Kowalski', role: 'accountant', units: 'imperial', timeZone: 'America/Denver' },
  { org: 'wrenfield', email: 'noah.quinn@wrenfield.test', name: 'Noah Quinn', role: 'brand_admin', units: 'imperial', timeZone: 'America/Denver' },
];

// A dealer's account with each brand it sells: account number and agreed labor rate
// (minor units per hour, in the brand's currency).
export const demoAccounts = [
  { dealer: 'lanternhill', brand: 'torvane', accountNumber: 'TV-US-0418', laborRateMinor: 8800 },
  { dealer: 'lanternhill', brand: 'wrenfield', accountNumber: 'WF-10072', laborRateMinor: 13500 },
  { dealer: 'kettenblatt', brand: 'torvane', accountNumber: 'TV-DE-0791', laborRateMinor: 7900 },
  { dealer: 'kettenblatt', brand: 'wrenfield', accountNumber: 'WF-20415', laborRateMinor: 9800 },
  { dealer: 'tidewheel', brand: 'torvane', accountNumber: 'TV-CA-0055', laborRateMinor: 10400 },
  { dealer: 'tidewheel', brand: 'wrenfield', accountNumber: 'WF-30118', laborRateMinor: 11000 },
];
