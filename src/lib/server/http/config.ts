import { env } from '$env/dynamic/private';
import { dirname, resolve } from 'node:path';
import { DEFAULT_DATABASE_URL } from '../db';

/** Everything the server writes lives under this folder (plus the database file itself). */
export function dataDir(): string {
	return resolve(env.DATA_DIR || dirname(env.DATABASE_URL || DEFAULT_DATABASE_URL));
}

export function publicOrigin(): string {
	return (env.ORIGIN || `http://localhost:${env.PORT || 3000}`).replace(/\/$/, '');
}

export const isProduction = () => env.NODE_ENV === 'production';
