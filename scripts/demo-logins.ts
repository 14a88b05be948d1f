import { DEMO_PASSWORD, DEMO_PEOPLE } from '../db/seed/people';

// Printed by npm start: who to sign in as, per space and role.
const lines = DEMO_PEOPLE.map((p) => {
  const roles = Object.entries(p.roles)
    .map(([space, r]) => `${space}: ${r!.join('+')}`)
    .join('; ');
  return `    ${p.email.padEnd(30)} ${p.name.padEnd(22)} ${roles}`;
});
console.log(`  Demo sign-ins (password for all: ${DEMO_PASSWORD})\n${lines.join('\n')}`);
