import type { Role } from '@shared/auth';

/**
 * The demo scenario: an invented studio, "Larchmont Road Cycle Fit", with invented people.
 * Every name, address and number here is made up. The e-mail domain is reserved for examples
 * (RFC 2606), so nothing can ever be delivered to a real person.
 */
export const DEMO_STUDIO_NAME = 'Larchmont Road Cycle Fit';

/** One password for every demo account, printed by `npm start`; demo use only. */
export const DEMO_PASSWORD = 'demo-ride-2026';

export interface DemoPerson {
  email: string;
  displayName: string;
  role: Role;
  timeZone: string;
}

export const DEMO_PEOPLE: DemoPerson[] = [
  { email: 'admin@larchmont.example', displayName: 'Odile Fenwick', role: 'admin', timeZone: 'Europe/London' },
  { email: 'tomas@larchmont.example', displayName: 'Tomás Ekwueme', role: 'fitter', timeZone: 'Europe/London' },
  { email: 'hanna@larchmont.example', displayName: 'Hanna Vesterlund', role: 'fitter', timeZone: 'Europe/Stockholm' },
  { email: 'physio@larchmont.example', displayName: 'Priya Castellanos', role: 'physio', timeZone: 'Europe/London' },
  { email: 'ben@rider.example', displayName: 'Ben Achterberg', role: 'rider', timeZone: 'Europe/Amsterdam' },
  { email: 'carla@rider.example', displayName: 'Carla Mendonça', role: 'rider', timeZone: 'America/New_York' },
  { email: 'deshawn@rider.example', displayName: 'DeShawn Ilori', role: 'rider', timeZone: 'Australia/Sydney' },
];
