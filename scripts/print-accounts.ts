import { DEMO_PASSWORD, DEMO_PEOPLE } from './demo/people';

const url = process.argv[2] ?? 'http://127.0.0.1:4321';
console.log(`\nSwardkeep is running at ${url}\n\nDemo sign-in accounts (password for all: ${DEMO_PASSWORD}):`);
for (const p of DEMO_PEOPLE) console.log(`  ${p.email.padEnd(26)} ${p.roles.join(', ')}  (${p.name})`);
console.log('\nPress Ctrl-C to stop.\n');
