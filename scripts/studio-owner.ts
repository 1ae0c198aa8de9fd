// npm run studio:owner -- someone@example.com: makes that address an owner of the studio (creating the
// account if needed). Runs with the react-server condition so the server-only lib code loads as it does
// inside Next.js.
import { checkEmailAddress } from '@/lib/auth/email-address';
import { makeOwner } from '@/lib/auth/people';
import { closeDb } from '@/lib/db/connection';

const input = process.argv[2];
if (!input) {
  console.error('Usage: npm run studio:owner -- someone@example.com');
  process.exit(2);
}
const checked = checkEmailAddress(input);
if (!checked.ok) {
  console.error(`${input}: ${checked.problem.message}`);
  process.exit(2);
}
try {
  const { created } = await makeOwner(checked.email);
  console.log(`${checked.email} is an owner${created ? ' (new account: they sign in with an e-mail link)' : ''}.`);
} finally {
  await closeDb();
}
