/** Blob storage: one BlobStore built from a StoreConfig (a local folder or an S3 bucket). */
import { createLocalStore } from './local';
import { createS3Store, type S3StoreConfig } from './s3';
import type { BlobStore } from './blob';

export type StoreConfig = { driver: 'local'; dir: string } | ({ driver: 's3' } & S3StoreConfig);

export function createStore(config: StoreConfig): BlobStore {
	if (config.driver === 'local') return createLocalStore(config.dir);
	if (config.driver === 's3') return createS3Store(config);
	throw new Error(`Unknown storage driver "${(config as { driver: unknown }).driver}"`);
}
