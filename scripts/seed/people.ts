import type { Role } from '../../db/schema';

/** The invented demo scenario: a teaching forge, its instructor and a handful of members. */
export const demoPassword = 'oxbloom-demo';
export const collectiveName = 'Saltmarsh Forge Collective';

export interface DemoPerson {
  email: string;
  name: string;
  role: Role;
}

export const demoPeople: DemoPerson[] = [
  { email: 'admin@oxbloom.test', name: 'Saltmarsh Keeper', role: 'admin' },
  { email: 'instructor@oxbloom.test', name: 'Morwenna Kilnworth', role: 'instructor' },
  { email: 'member@oxbloom.test', name: 'Tamsin Reedbank', role: 'member' },
  { email: 'member2@oxbloom.test', name: 'Osric Flintmere', role: 'member' },
  { email: 'wren@oxbloom.test', name: 'Wren Tidewell', role: 'member' },
  { email: 'jory@oxbloom.test', name: 'Jory Brackwater', role: 'member' },
];
