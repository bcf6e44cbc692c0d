// Prints the demo sign-ins after `npm start` has brought everything up.
import { DEMO_PASSWORD, demoOrganisations, demoUsers } from '../db/seeds/demo-people';

const orgName = (slug: string) => demoOrganisations.find((o) => o.slug === slug)?.name ?? slug;
console.log(`\n  Demo sign-ins (password for every one: ${DEMO_PASSWORD})\n`);
for (const u of demoUsers) {
  console.log(`    ${u.role.padEnd(13)} ${u.email.padEnd(34)} ${orgName(u.org)} (${u.units})`);
}
