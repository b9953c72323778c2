// Used by npm start: migrations run when the database opens; the demo scenario is added only
// to an empty database, so a real installation is never touched.
import { isEmpty, seedDemo } from '$lib/server/seed/demo';

if (isEmpty()) {
	console.log('Empty database: adding the demo scenario (marked as demo data).');
	await seedDemo();
}
