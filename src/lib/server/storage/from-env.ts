import { env } from '$env/dynamic/private';
import { join } from 'node:path';
import { dataDir } from '../http/config';
import { createStore, type StoreConfig } from './index';
import type { BlobStore } from './blob';

type Env = Record<string, string | undefined>;

/** The storage configuration is wrong; the message names the variable. */
export class StorageConfigError extends Error {
	constructor(
		readonly variable: string,
		problem: string
	) {
		super(`${variable} ${problem}`);
		this.name = 'StorageConfigError';
	}
}

/**
 * STORAGE_DRIVER=local (default; files under DATA_DIR/blobs) or s3 with S3_BUCKET, S3_REGION,
 * S3_ACCESS_KEY_ID, S3_SECRET_ACCESS_KEY, optional S3_ENDPOINT and S3_FORCE_PATH_STYLE=true|false.
 */
export function storeConfigFromEnv(e: Env, dataFolder: string): StoreConfig {
	const driver = (e.STORAGE_DRIVER ?? '').trim().toLowerCase() || 'local';
	if (driver === 'local') return { driver: 'local', dir: join(dataFolder, 'blobs') };
	if (driver !== 's3')
		throw new StorageConfigError('STORAGE_DRIVER', `must be local or s3, not "${driver}"`);
	const need = (name: string) => {
		const v = e[name]?.trim();
		if (!v) throw new StorageConfigError(name, 'is required when STORAGE_DRIVER=s3');
		return v;
	};
	const bucket = need('S3_BUCKET');
	const region = e.S3_REGION?.trim() || 'us-east-1';
	const accessKeyId = need('S3_ACCESS_KEY_ID');
	const secretAccessKey = need('S3_SECRET_ACCESS_KEY');
	const endpoint = e.S3_ENDPOINT?.trim() || undefined;
	if (endpoint && !/^https?:\/\/[^\s/]+/.test(endpoint)) {
		throw new StorageConfigError('S3_ENDPOINT', 'must be an http:// or https:// URL');
	}
	const style = (e.S3_FORCE_PATH_STYLE ?? '').trim().toLowerCase();
	if (style && !['true', 'false', '1', '0'].includes(style)) {
		throw new StorageConfigError('S3_FORCE_PATH_STYLE', 'must be true or false');
	}
	return {
		driver: 's3',
		bucket,
		region,
		accessKeyId,
		secretAccessKey,
		endpoint,
		forcePathStyle: style === 'true' || style === '1'
	};
}

let store: BlobStore | null = null;

/** The process's blob store, built from the environment on first use. */
export function blobStore(): BlobStore {
	store ??= createStore(storeConfigFromEnv(env, dataDir()));
	return store;
}

/** Tests swap in their own store (a temporary folder, a failing one); null goes back to the env's. */
export function useBlobStore(next: BlobStore | null): void {
	store = next;
}
