// The environment `npm start` gives the server (scripts/start.js), in one place so tests can start
// a server exactly as `npm start` does.

/** @param {Record<string, string | undefined>} base */
export function startEnv(base = process.env) {
	const env = { ...base };
	// Production unless told otherwise: development aids (the local mail page) must never be the default.
	env.NODE_ENV ??= 'production';
	env.PORT ??= '3000';
	env.ORIGIN ??= `http://localhost:${env.PORT}`;
	env.DATABASE_URL ??= './data/bandwright.db';
	env.BODY_SIZE_LIMIT ??= '16M'; // uploads: sweeps ≤ 10 MB, images ≤ 15 MB, checked again in code
	return env;
}
