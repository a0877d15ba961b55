import {
	CreateBucketCommand,
	DeleteObjectCommand,
	GetObjectCommand,
	HeadBucketCommand,
	ListObjectsV2Command,
	PutObjectCommand,
	S3Client
} from '@aws-sdk/client-s3';
import { config } from './config';

let client: S3Client | undefined;

function s3(): S3Client {
	const { endpoint, region, credentials, forcePathStyle } = config().s3;
	client ??= new S3Client({
		endpoint,
		region,
		credentials,
		forcePathStyle,
		// Checksums only where the API demands them: S3-compatible stores other than AWS often
		// refuse the streaming checksum trailers the SDK would otherwise add to every upload.
		requestChecksumCalculation: 'WHEN_REQUIRED',
		responseChecksumValidation: 'WHEN_REQUIRED'
	});
	return client;
}

const bucket = () => config().s3.bucket;

export async function putObject(key: string, body: Uint8Array, contentType: string): Promise<void> {
	await s3().send(new PutObjectCommand({ Bucket: bucket(), Key: key, Body: body, ContentType: contentType }));
}

export async function getObject(key: string): Promise<{ body: Uint8Array; contentType?: string }> {
	const out = await s3().send(new GetObjectCommand({ Bucket: bucket(), Key: key }));
	if (!out.Body) throw new Error(`storage: object ${key} has no body`);
	return { body: await out.Body.transformToByteArray(), contentType: out.ContentType };
}

export async function deleteObject(key: string): Promise<void> {
	await s3().send(new DeleteObjectCommand({ Bucket: bucket(), Key: key }));
}

/** Every key under a prefix (for clean-up and for checking that a refused upload stored nothing). */
export async function listKeys(prefix: string): Promise<string[]> {
	const keys: string[] = [];
	let token: string | undefined;
	do {
		const out = await s3().send(new ListObjectsV2Command({ Bucket: bucket(), Prefix: prefix, ContinuationToken: token }));
		keys.push(...(out.Contents ?? []).map((o) => o.Key!).filter(Boolean));
		token = out.IsTruncated ? out.NextContinuationToken : undefined;
	} while (token);
	return keys;
}

/** Creates the configured bucket when it does not exist (local fakes; production buckets are made by hand). */
export async function ensureBucket(): Promise<void> {
	try {
		await s3().send(new HeadBucketCommand({ Bucket: bucket() }));
	} catch {
		await s3().send(new CreateBucketCommand({ Bucket: bucket() }));
	}
}
