import { createServer, type IncomingMessage, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { BlobInputError, newBlobKey, type BlobStore } from './blob';
import { createStore } from './index';

// Needs @aws-sdk/client-s3 installed. The server below speaks just enough path-style S3 REST
// (PUT/GET/DELETE Object, the NoSuchKey error) for the driver; it checks that requests are signed.
interface Seen {
	method: string;
	path: string;
	authorization: string;
	contentType?: string;
}

const BUCKET = 'bandwright-test';
const ACCESS_KEY = 'AKIDBANDWRIGHTTEST'; // invented test credential
const objects = new Map<string, { body: Buffer; type: string }>();
const seen: Seen[] = [];
const denied = new Set<string>();
let server: Server;
let store: BlobStore;

function readBody(req: IncomingMessage): Promise<Buffer> {
	return new Promise((resolve, reject) => {
		const chunks: Buffer[] = [];
		req.on('data', (c: Buffer) => chunks.push(c));
		req.on('end', () => resolve(Buffer.concat(chunks)));
		req.on('error', reject);
	});
}

function s3Error(status: number, code: string, key: string): [number, string] {
	return [
		status,
		`<?xml version="1.0" encoding="UTF-8"?><Error><Code>${code}</Code>` +
			`<Message>${code}</Message><Key>${key}</Key><RequestId>1</RequestId></Error>`
	];
}

beforeAll(async () => {
	server = createServer(async (req, res) => {
		const url = new URL(req.url ?? '/', 'http://localhost');
		const [, bucket, ...rest] = url.pathname.split('/');
		const key = rest.map(decodeURIComponent).join('/');
		const body = await readBody(req);
		seen.push({
			method: req.method ?? '',
			path: url.pathname,
			authorization: req.headers.authorization ?? '',
			contentType: req.headers['content-type']
		});
		const send = (status: number, payload: Buffer | string = '', type = 'application/xml') => {
			res.writeHead(status, { 'content-type': type, 'content-length': Buffer.byteLength(payload) });
			res.end(payload);
		};
		if (bucket !== BUCKET) return send(...s3Error(404, 'NoSuchBucket', key));
		if (denied.has(key)) return send(...s3Error(403, 'AccessDenied', key));
		if (req.method === 'PUT') {
			objects.set(key, { body, type: req.headers['content-type'] ?? 'binary/octet-stream' });
			res.setHeader('etag', '"fake"');
			return send(200);
		}
		if (req.method === 'GET' && url.searchParams.get('list-type') === '2') {
			// ListObjectsV2, two keys a page, so the driver must follow continuation tokens.
			const keys = [...objects.keys()].sort();
			const from = Number(url.searchParams.get('continuation-token') ?? 0);
			const page = keys.slice(from, from + 2);
			const more = from + 2 < keys.length;
			return send(
				200,
				`<?xml version="1.0" encoding="UTF-8"?><ListBucketResult><Name>${BUCKET}</Name>` +
					page.map((k) => `<Contents><Key>${k}</Key></Contents>`).join('') +
					`<IsTruncated>${more}</IsTruncated>${more ? `<NextContinuationToken>${from + 2}</NextContinuationToken>` : ''}</ListBucketResult>`
			);
		}
		if (req.method === 'GET') {
			const o = objects.get(key);
			return o ? send(200, o.body, o.type) : send(...s3Error(404, 'NoSuchKey', key));
		}
		if (req.method === 'DELETE') {
			objects.delete(key);
			return send(204);
		}
		send(405);
	});
	await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
	const { port } = server.address() as AddressInfo;
	store = createStore({
		driver: 's3',
		bucket: BUCKET,
		endpoint: `http://127.0.0.1:${port}`,
		region: 'eu-central-1',
		accessKeyId: ACCESS_KEY,
		secretAccessKey: 'invented-test-secret',
		forcePathStyle: true
	});
});

afterAll(async () => {
	server.closeAllConnections();
	await new Promise<void>((resolve) => server.close(() => resolve()));
});

beforeEach(() => {
	objects.clear();
	seen.length = 0;
	denied.clear();
});

describe('s3 store against a fake S3 server', () => {
	it('puts an object path-style with its content type and a SigV4 signature', async () => {
		const key = newBlobKey('photos');
		const bytes = Uint8Array.from({ length: 300 }, (_, i) => i % 256);
		await store.put(key, bytes, 'image/webp');
		expect(objects.get(key)?.type).toBe('image/webp');
		expect(new Uint8Array(objects.get(key)?.body ?? [])).toEqual(bytes);
		expect(seen).toHaveLength(1);
		expect(seen[0]).toMatchObject({ method: 'PUT', path: `/${BUCKET}/${key}` });
		// AWS Signature Version 4: Credential=<key id>/<date>/<region>/s3/aws4_request
		expect(seen[0].authorization).toMatch(
			new RegExp(`^AWS4-HMAC-SHA256 Credential=${ACCESS_KEY}/\\d{8}/eu-central-1/s3/aws4_request`)
		);
	});

	it('gets the bytes back and returns null for a missing key (NoSuchKey)', async () => {
		const key = newBlobKey('sweeps');
		await store.put(key, Uint8Array.of(1, 2, 3), 'text/csv');
		expect(await store.get(key)).toEqual(Uint8Array.of(1, 2, 3));
		expect(await store.get(newBlobKey('sweeps'))).toBeNull();
	});

	it('deletes an object; deleting a missing key succeeds', async () => {
		const key = newBlobKey('photos');
		await store.put(key, Uint8Array.of(5), 'image/png');
		await store.delete(key);
		expect(objects.has(key)).toBe(false);
		await expect(store.delete(key)).resolves.toBeUndefined();
		expect(seen.filter((s) => s.method === 'DELETE')).toHaveLength(2);
	});

	it('lists every key across pages, and has no temporary objects to remove', async () => {
		const keys = [
			newBlobKey('photos'),
			newBlobKey('photos'),
			newBlobKey('sweeps'),
			newBlobKey('sweeps'),
			newBlobKey('sweeps')
		];
		for (const key of keys) await store.put(key, Uint8Array.of(1), 'image/webp');
		const listed: string[] = [];
		for await (const key of store.list()) listed.push(key);
		expect(listed.sort()).toEqual([...keys].sort());
		expect(await store.removeTemporary()).toEqual([]);
	});

	it('passes on errors other than not-found', async () => {
		const key = newBlobKey('photos');
		denied.add(key);
		await expect(store.get(key)).rejects.toMatchObject({ name: 'AccessDenied' });
	});

	it('rejects bad keys and content types before sending anything', async () => {
		await expect(store.put('../x', Uint8Array.of(1), 'text/plain')).rejects.toThrow(BlobInputError);
		await expect(store.get('a//b')).rejects.toThrow(BlobInputError);
		await expect(store.delete('/abs')).rejects.toThrow(BlobInputError);
		await expect(store.put('ok', Uint8Array.of(1), 'text/plain\nX: y')).rejects.toMatchObject({
			field: 'contentType'
		});
		expect(seen).toEqual([]);
	});
});
