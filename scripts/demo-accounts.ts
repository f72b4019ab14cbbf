import type { Role } from '../src/lib/schemas/roles';

/** The invented people of the demo property (DESIGN.md, Demo scenario). Listed in the README. */
export const DEMO_PASSWORD = 'saltbush-demo';

export const DEMO_ACCOUNTS: { email: string; name: string; role: Role }[] = [
  { email: 'owner@saltbush-rise.example', name: 'Margaret Ashby', role: 'owner' },
  { email: 'manager@saltbush-rise.example', name: 'Tom Reilly', role: 'manager' },
  { email: 'crew@saltbush-rise.example', name: 'Jess Kowalski', role: 'crew' },
  { email: 'viewer@saltbush-rise.example', name: 'Dev Anand', role: 'viewer' },
];
