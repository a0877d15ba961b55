import {
	CreateBucketCommand,
	DeleteObjectCommand,
	GetObjectCommand,
	HeadBucketCommand,
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

/** Creates the configured bucket when it does not exist (local fakes; production buckets are made by hand). */
export async function ensureBucket(): Promise<void> {
	try {
		await s3().send(new HeadBucketCommand({ Bucket: bucket() }));
	} catch {
		await s3().send(new CreateBucketCommand({ Bucket: bucket() }));
	}
}
