import { checkBlobInput, checkBlobKey, type BlobStore } from './blob';

export interface S3StoreConfig {
	bucket: string;
	/** For S3-compatible services (MinIO, R2, …); omit for AWS. */
	endpoint?: string;
	region: string;
	accessKeyId: string;
	secretAccessKey: string;
	forcePathStyle?: boolean;
}

// The parts of @aws-sdk/client-s3 used here, typed locally so the app compiles without it.
interface ObjectInput {
	Bucket: string;
	Key: string;
}
interface GetOutput {
	Body?: { transformToByteArray(): Promise<Uint8Array> };
}
interface ListOutput {
	Contents?: { Key?: string }[];
	IsTruncated?: boolean;
	NextContinuationToken?: string;
}
interface S3ClientLike {
	send(command: unknown): Promise<unknown>;
}
interface S3Sdk {
	S3Client: new (config: Record<string, unknown>) => S3ClientLike;
	PutObjectCommand: new (
		input: ObjectInput & { Body: Uint8Array; ContentType: string; ContentLength: number }
	) => unknown;
	GetObjectCommand: new (input: ObjectInput) => unknown;
	DeleteObjectCommand: new (input: ObjectInput) => unknown;
	ListObjectsV2Command: new (input: { Bucket: string; ContinuationToken?: string }) => unknown;
}

// A variable specifier keeps bundlers from resolving the package at build time.
const SDK = '@aws-sdk/client-s3';

function isNotFound(e: unknown): boolean {
	const err = e as { name?: string; $metadata?: { httpStatusCode?: number } } | null;
	return err?.name === 'NoSuchKey' || err?.$metadata?.httpStatusCode === 404;
}

/** Blobs in an S3 bucket. The SDK is loaded on first use. */
export function createS3Store(config: S3StoreConfig): BlobStore {
	for (const field of ['bucket', 'region', 'accessKeyId', 'secretAccessKey'] as const) {
		if (typeof config[field] !== 'string' || config[field] === '') {
			throw new Error(`S3 storage needs "${field}"`);
		}
	}
	const Bucket = config.bucket;
	let loading: Promise<{ sdk: S3Sdk; client: S3ClientLike }> | null = null;

	function connect() {
		loading ??= (async () => {
			let sdk: S3Sdk;
			try {
				sdk = (await import(/* @vite-ignore */ SDK)) as S3Sdk;
			} catch (e) {
				loading = null;
				throw new Error(`S3 storage needs the ${SDK} package`, { cause: e });
			}
			const client = new sdk.S3Client({
				region: config.region,
				endpoint: config.endpoint,
				forcePathStyle: config.forcePathStyle ?? false,
				credentials: { accessKeyId: config.accessKeyId, secretAccessKey: config.secretAccessKey },
				// Many S3-compatible services reject the SDK's newer default checksum headers.
				requestChecksumCalculation: 'WHEN_REQUIRED',
				responseChecksumValidation: 'WHEN_REQUIRED'
			});
			return { sdk, client };
		})();
		return loading;
	}

	return {
		async put(key, bytes, contentType) {
			const Key = checkBlobKey(key);
			checkBlobInput(bytes, contentType);
			const { sdk, client } = await connect();
			await client.send(
				new sdk.PutObjectCommand({
					Bucket,
					Key,
					Body: bytes,
					ContentType: contentType,
					ContentLength: bytes.byteLength
				})
			);
		},

		async get(key) {
			const Key = checkBlobKey(key);
			const { sdk, client } = await connect();
			try {
				const out = (await client.send(new sdk.GetObjectCommand({ Bucket, Key }))) as GetOutput;
				return out.Body ? await out.Body.transformToByteArray() : new Uint8Array(0);
			} catch (e) {
				if (isNotFound(e)) return null;
				throw e;
			}
		},

		async delete(key) {
			const Key = checkBlobKey(key);
			const { sdk, client } = await connect();
			await client.send(new sdk.DeleteObjectCommand({ Bucket, Key }));
		},

		async *list() {
			const { sdk, client } = await connect();
			let ContinuationToken: string | undefined;
			do {
				const out = (await client.send(
					new sdk.ListObjectsV2Command({ Bucket, ContinuationToken })
				)) as ListOutput;
				for (const o of out.Contents ?? []) if (o.Key) yield o.Key;
				ContinuationToken = out.IsTruncated ? out.NextContinuationToken : undefined;
			} while (ContinuationToken);
		},

		// A PutObject is whole or absent: S3 keeps nothing half-written.
		async removeTemporary() {
			return [];
		}
	};
}
