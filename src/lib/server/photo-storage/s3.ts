import { DeleteObjectCommand, GetObjectCommand, ListObjectsV2Command, NoSuchKey, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import type { PhotoS3Config } from '../config';
import { checkPhotoKey, isPhotoKey, type PhotoStore } from './photo-store';

/**
 * Photos in an S3 bucket (or anything speaking its API: an endpoint and path-style addressing
 * for a self-hosted store). A put resolves once S3 has acknowledged the whole object.
 */
export function s3Store(config: PhotoS3Config): PhotoStore {
  const client = new S3Client({
    region: config.region,
    endpoint: config.endpoint,
    forcePathStyle: config.forcePathStyle,
    credentials: config.accessKeyId && config.secretAccessKey ? { accessKeyId: config.accessKeyId, secretAccessKey: config.secretAccessKey } : undefined,
  });
  const Bucket = config.bucket;
  return {
    kind: 's3',
    async put(key, bytes, contentType) {
      await client.send(new PutObjectCommand({ Bucket, Key: checkPhotoKey(key), Body: bytes, ContentType: contentType, ContentLength: bytes.byteLength }));
    },
    async get(key) {
      try {
        const answer = await client.send(new GetObjectCommand({ Bucket, Key: checkPhotoKey(key) }));
        return answer.Body ? await answer.Body.transformToByteArray() : null;
      } catch (error) {
        if (error instanceof NoSuchKey || (error as { name?: string }).name === 'NoSuchKey') return null;
        throw error;
      }
    },
    async remove(key) {
      await client.send(new DeleteObjectCommand({ Bucket, Key: checkPhotoKey(key) }));
    },
    async keys() {
      const keys: string[] = [];
      let ContinuationToken: string | undefined;
      do {
        const page = await client.send(new ListObjectsV2Command({ Bucket, Prefix: 'photos/', ContinuationToken }));
        for (const object of page.Contents ?? []) if (object.Key && isPhotoKey(object.Key)) keys.push(object.Key);
        ContinuationToken = page.IsTruncated ? page.NextContinuationToken : undefined;
      } while (ContinuationToken);
      return keys;
    },
  };
}
