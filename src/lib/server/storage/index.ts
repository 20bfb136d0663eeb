import {
	DeleteObjectCommand,
	GetObjectCommand,
	HeadBucketCommand,
	HeadObjectCommand,
	ListObjectsV2Command,
	PutObjectCommand,
	S3Client
} from '@aws-sdk/client-s3';
import { config } from '../config';

// The only module that talks to S3. The app reaches the local s3rver exactly as it would a
// hosted S3: through the AWS SDK, path-style addressing.

let client: S3Client | undefined;
let endpointOverride: string | null = null;

function s3(): S3Client {
	if (!client) {
		const c = config();
		client = new S3Client({
			endpoint: endpointOverride ?? c.S3_ENDPOINT,
			region: c.S3_REGION,
			forcePathStyle: true,
			credentials: { accessKeyId: c.S3_ACCESS_KEY_ID, secretAccessKey: c.S3_SECRET_ACCESS_KEY },
			// s3rver predates the SDK's default CRC checksums; ask for them only when required.
			requestChecksumCalculation: 'WHEN_REQUIRED',
			responseChecksumValidation: 'WHEN_REQUIRED',
			maxAttempts: 2
		});
	}
	return client;
}

const bucket = () => config().S3_BUCKET;

/**
 * Test seam: points this module at another S3 endpoint (an s3rver a test starts and stops on
 * a port of its own), or back at the configured one with `null`. The app never calls it.
 */
export function useS3Endpoint(endpoint: string | null): void {
	client?.destroy();
	client = undefined;
	endpointOverride = endpoint;
}

export async function putObject(key: string, body: Buffer, contentType: string): Promise<void> {
	await s3().send(
		new PutObjectCommand({ Bucket: bucket(), Key: key, Body: body, ContentType: contentType })
	);
}

export async function getObject(key: string): Promise<Buffer> {
	const result = await s3().send(new GetObjectCommand({ Bucket: bucket(), Key: key }));
	if (!result.Body) throw new Error(`S3 object ${key} has no body`);
	return Buffer.from(await result.Body.transformToByteArray());
}

export async function deleteObject(key: string): Promise<void> {
	await s3().send(new DeleteObjectCommand({ Bucket: bucket(), Key: key }));
}

export async function objectExists(key: string): Promise<boolean> {
	try {
		await s3().send(new HeadObjectCommand({ Bucket: bucket(), Key: key }));
		return true;
	} catch (error) {
		if ((error as { name?: string }).name === 'NotFound') return false;
		throw error;
	}
}

export async function listKeys(prefix: string): Promise<string[]> {
	const keys: string[] = [];
	let token: string | undefined;
	do {
		const page = await s3().send(
			new ListObjectsV2Command({ Bucket: bucket(), Prefix: prefix, ContinuationToken: token })
		);
		for (const item of page.Contents ?? []) if (item.Key) keys.push(item.Key);
		token = page.IsTruncated ? page.NextContinuationToken : undefined;
	} while (token);
	return keys;
}

export interface StoredObject {
	key: string;
	lastModified: Date | null;
}

/** Every object under `prefix`, with when it was written (the orphan sweeper's grace period). */
export async function listObjects(prefix: string): Promise<StoredObject[]> {
	const objects: StoredObject[] = [];
	let token: string | undefined;
	do {
		const page = await s3().send(
			new ListObjectsV2Command({ Bucket: bucket(), Prefix: prefix, ContinuationToken: token })
		);
		for (const item of page.Contents ?? []) {
			if (item.Key) objects.push({ key: item.Key, lastModified: item.LastModified ?? null });
		}
		token = page.IsTruncated ? page.NextContinuationToken : undefined;
	} while (token);
	return objects;
}

/** True when the bucket answers; used by the health check. */
export async function storageHealthy(): Promise<boolean> {
	try {
		await s3().send(new HeadBucketCommand({ Bucket: bucket() }));
		return true;
	} catch {
		return false;
	}
}

// ---------------------------------------------------------------- access-log anchors
// The access log's anchored heads live in a bucket of their own (in production one with
// object lock). This module offers no way to delete or overwrite one: an anchor is created
// once under a key that names its row and hash, and a second write of the same key is refused.

const anchorBucket = () => config().AUDIT_ANCHOR_BUCKET;

/** Creates the anchor object unless one exists under that key; true when it was written. */
export async function createAnchorObject(key: string, body: string): Promise<boolean> {
	try {
		await s3().send(new HeadObjectCommand({ Bucket: anchorBucket(), Key: key }));
		return false;
	} catch (error) {
		if ((error as { name?: string }).name !== 'NotFound') throw error;
	}
	await s3().send(
		new PutObjectCommand({
			Bucket: anchorBucket(),
			Key: key,
			Body: body,
			ContentType: 'application/json',
			// S3 refuses the write if the key appeared meanwhile (conditional write).
			IfNoneMatch: '*'
		})
	);
	return true;
}

export async function listAnchorKeys(prefix: string): Promise<string[]> {
	const keys: string[] = [];
	let token: string | undefined;
	do {
		const page = await s3().send(
			new ListObjectsV2Command({
				Bucket: anchorBucket(),
				Prefix: prefix,
				ContinuationToken: token
			})
		);
		for (const item of page.Contents ?? []) if (item.Key) keys.push(item.Key);
		token = page.IsTruncated ? page.NextContinuationToken : undefined;
	} while (token);
	return keys;
}

export async function readAnchorObject(key: string): Promise<string> {
	const result = await s3().send(new GetObjectCommand({ Bucket: anchorBucket(), Key: key }));
	if (!result.Body) throw new Error(`anchor ${key} has no body`);
	return result.Body.transformToString('utf8');
}
