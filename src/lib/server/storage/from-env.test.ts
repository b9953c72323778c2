import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { StorageConfigError, storeConfigFromEnv } from './from-env';

const S3 = {
	STORAGE_DRIVER: 's3',
	S3_BUCKET: 'bandwright-files',
	S3_REGION: 'eu-central-1',
	S3_ACCESS_KEY_ID: 'AKIDEXAMPLE', // invented test credential
	S3_SECRET_ACCESS_KEY: 'invented-secret'
};

describe('storage from the environment', () => {
	it('defaults to local files under the data folder', () => {
		expect(storeConfigFromEnv({}, '/srv/bw')).toEqual({
			driver: 'local',
			dir: join('/srv/bw', 'blobs')
		});
		expect(storeConfigFromEnv({ STORAGE_DRIVER: ' LOCAL ' }, '/d')).toEqual({
			driver: 'local',
			dir: join('/d', 'blobs')
		});
	});

	it('builds an S3 configuration with endpoint and path style', () => {
		expect(
			storeConfigFromEnv(
				{ ...S3, S3_ENDPOINT: 'http://localhost:9000', S3_FORCE_PATH_STYLE: 'true' },
				'/d'
			)
		).toEqual({
			driver: 's3',
			bucket: 'bandwright-files',
			region: 'eu-central-1',
			accessKeyId: 'AKIDEXAMPLE',
			secretAccessKey: 'invented-secret',
			endpoint: 'http://localhost:9000',
			forcePathStyle: true
		});
		const aws = storeConfigFromEnv(S3, '/d');
		expect(aws.driver === 's3' && aws.endpoint === undefined && aws.forcePathStyle === false).toBe(
			true
		);
	});

	it('names the variable that is missing or wrong', () => {
		const fails = (e: Record<string, string>, variable: string) => {
			try {
				storeConfigFromEnv(e, '/d');
			} catch (err) {
				expect(err).toBeInstanceOf(StorageConfigError);
				expect((err as StorageConfigError).variable).toBe(variable);
				return;
			}
			throw new Error(`expected ${variable} to be refused`);
		};
		fails({ STORAGE_DRIVER: 'ftp' }, 'STORAGE_DRIVER');
		fails({ ...S3, S3_BUCKET: '' }, 'S3_BUCKET');
		fails({ ...S3, S3_SECRET_ACCESS_KEY: ' ' }, 'S3_SECRET_ACCESS_KEY');
		fails({ ...S3, S3_ENDPOINT: 'localhost:9000' }, 'S3_ENDPOINT');
		fails({ ...S3, S3_FORCE_PATH_STYLE: 'yes please' }, 'S3_FORCE_PATH_STYLE');
	});
});
