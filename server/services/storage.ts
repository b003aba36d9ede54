import {
  S3Client, PutObjectCommand, GetObjectCommand, DeleteObjectCommand, CreateBucketCommand, HeadBucketCommand,
} from '@aws-sdk/client-s3';

export interface ObjectStore {
  put(key: string, body: Buffer, contentType: string): Promise<void>;
  get(key: string): Promise<{ body: Buffer; contentType: string }>;
  remove(key: string): Promise<void>;
  ensureBucket(): Promise<void>;
}

/** Photos through the S3 SDK. The path-style and checksum settings keep s3rver byte-exact. */
export function createObjectStore(opts: {
  endpoint: string; bucket: string; region: string; accessKeyId: string; secretAccessKey: string;
}): ObjectStore {
  const client = new S3Client({
    endpoint: opts.endpoint || undefined,
    region: opts.region,
    forcePathStyle: true,
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
    credentials: { accessKeyId: opts.accessKeyId, secretAccessKey: opts.secretAccessKey },
  });
  const Bucket = opts.bucket;
  return {
    async put(key, body, contentType) {
      await client.send(new PutObjectCommand({ Bucket, Key: key, Body: body, ContentType: contentType }));
    },
    async get(key) {
      const out = await client.send(new GetObjectCommand({ Bucket, Key: key }));
      const bytes = await out.Body!.transformToByteArray();
      return { body: Buffer.from(bytes), contentType: out.ContentType ?? 'application/octet-stream' };
    },
    async remove(key) {
      await client.send(new DeleteObjectCommand({ Bucket, Key: key }));
    },
    async ensureBucket() {
      try {
        await client.send(new HeadBucketCommand({ Bucket }));
      } catch {
        await client.send(new CreateBucketCommand({ Bucket }));
      }
    },
  };
}
