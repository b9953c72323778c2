// npm run seed — adds the demo scenario (idempotent: existing demo rows are kept).
import { seedDemo } from '$lib/server/seed/demo';

await seedDemo();
console.log(
	'Demo data is in place. Every account, design and sweep it made is marked as demo data.'
);
