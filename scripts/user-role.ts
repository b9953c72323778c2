// npm run user:role -- <email> <role>   (creates the first moderator; the change is audited)
import { findUserByEmail } from '$lib/server/accounts/accounts';
import { setRole } from '$lib/server/accounts/users';
import { ROLES, type Role } from '$lib/server/db/schema';

const [email, role] = process.argv.slice(2);
if (!email || !role || !(ROLES as readonly string[]).includes(role)) {
	console.error(`usage: npm run user:role -- <email> <${ROLES.join('|')}>`);
	process.exit(2);
}
const user = findUserByEmail(email);
if (!user) {
	console.error(`No account with the e-mail ${email}.`);
	process.exit(1);
}
const result = setRole(null, user.id, role as Role);
if (!result.ok) {
	console.error(result.message);
	process.exit(1);
}
console.log(`${user.email}: ${result.from} → ${result.to}`);
