// Object storage for shots: S3 or any S3-compatible service through the AWS SDK. `npm start` and
// `npm test` start a local fake (s3rver, scripts/lib/storage-fake.mjs) and set the variables below;
// with them set by hand the product uses that service (README, "Past one machine"). Nothing is kept on
// an app server's disk: bytes go straight from the request's memory to the bucket.
import {
	DeleteObjectsCommand,
	GetObjectCommand,
	HeadObjectCommand,
	NoSuchKey,
	PutObjectCommand,
	S3Client
} from '@aws-sdk/client-s3';
import { env } from '$env/dynamic/private';

export interface StorageConfig {
	endpoint?: string;
	bucket: string;
	region: string;
	accessKeyId?: string;
	secretAccessKey?: string;
	forcePathStyle: boolean;
}

export function storageConfigFrom(vars: Record<string, string | undefined>): StorageConfig | null {
	const bucket = vars.S3_BUCKET;
	if (!bucket) return null;
	return {
		endpoint: vars.S3_ENDPOINT || undefined,
		bucket,
		region: vars.S3_REGION || 'us-east-1',
		accessKeyId: vars.S3_ACCESS_KEY_ID || vars.AWS_ACCESS_KEY_ID || undefined,
		secretAccessKey: vars.S3_SECRET_ACCESS_KEY || vars.AWS_SECRET_ACCESS_KEY || undefined,
		// Path-style addressing for services on a plain host and port (the fake, MinIO and the like).
		forcePathStyle: vars.S3_FORCE_PATH_STYLE === '1' || vars.S3_FORCE_PATH_STYLE === 'true'
	};
}

export class StorageUnavailable extends Error {}

export class ObjectStore {
	readonly client: S3Client;
	constructor(readonly config: StorageConfig) {
		this.client = new S3Client({
			endpoint: config.endpoint,
			region: config.region,
			forcePathStyle: config.forcePathStyle,
			credentials:
				config.accessKeyId && config.secretAccessKey
					? { accessKeyId: config.accessKeyId, secretAccessKey: config.secretAccessKey }
					: undefined,
			// Checksums only where S3 requires them: s3rver corrupts uploads sent with the SDK's default
			// flexible checksums (TOOLCHAIN.md), and the app checks what it reads by decoding it anyway.
			requestChecksumCalculation: 'WHEN_REQUIRED',
			responseChecksumValidation: 'WHEN_REQUIRED',
			maxAttempts: 2
		});
	}

	async put(key: string, body: Uint8Array, contentType: string): Promise<void> {
		try {
			await this.client.send(new PutObjectCommand({ Bucket: this.config.bucket, Key: key, Body: body, ContentType: contentType }));
		} catch (e) {
			throw new StorageUnavailable(`storage refused ${key}: ${(e as Error).message}`);
		}
	}

	/** The object's bytes, or null when there is no such object. */
	async get(key: string): Promise<Uint8Array | null> {
		try {
			const out = await this.client.send(new GetObjectCommand({ Bucket: this.config.bucket, Key: key }));
			return out.Body ? await out.Body.transformToByteArray() : null;
		} catch (e) {
			if (e instanceof NoSuchKey || (e as { name?: string }).name === 'NoSuchKey') return null;
			throw new StorageUnavailable(`storage could not read ${key}: ${(e as Error).message}`);
		}
	}

	async exists(key: string): Promise<boolean> {
		try {
			await this.client.send(new HeadObjectCommand({ Bucket: this.config.bucket, Key: key }));
			return true;
		} catch (e) {
			const status = (e as { $metadata?: { httpStatusCode?: number } }).$metadata?.httpStatusCode;
			if (status === 404) return false;
			throw new StorageUnavailable(`storage could not check ${key}: ${(e as Error).message}`);
		}
	}

	/** Deletes the objects (missing ones are fine); throws StorageUnavailable when storage cannot be reached. */
	async remove(keys: string[]): Promise<void> {
		if (!keys.length) return;
		try {
			const out = await this.client.send(
				new DeleteObjectsCommand({ Bucket: this.config.bucket, Delete: { Objects: keys.map((Key) => ({ Key })), Quiet: true } })
			);
			if (out.Errors?.length) throw new Error(out.Errors[0].Message ?? 'delete refused');
		} catch (e) {
			throw new StorageUnavailable(`storage could not delete ${keys[0]}: ${(e as Error).message}`);
		}
	}
}

let store: ObjectStore | null = null;

/** The app's object store, made on first use from S3_* variables. */
export function objectStore(): ObjectStore {
	if (store) return store;
	const config = storageConfigFrom(env);
	if (!config) throw new StorageUnavailable('Object storage is not configured: set S3_BUCKET (README, Configuration).');
	store = new ObjectStore(config);
	return store;
}

/** For tests that point the app's code at a storage fake of their own. */
export function useObjectStore(next: ObjectStore | null) {
	store = next;
}
