import { readFileSync } from 'node:fs';
import { parse } from 'dotenv';
import { describe, expect, it } from 'vitest';
import { parseConfig } from '../../../../src/lib/server/config';

const SECRET = { NODE_ENV: 'production', AUTH_SECRET: 'a-production-secret-that-is-long-enough-0123456789' } as const;

describe('photo settings', () => {
  it('the photo lines of .env.example, as shipped (empty S3 settings), keep photos on local disk with a 20 MB limit', () => {
    const lines = Object.entries(parse(readFileSync('.env.example', 'utf8'))).filter(([name]) => name.includes('PHOTO'));
    expect(lines.map(([name]) => name)).toContain('PHOTO_S3_ENDPOINT');
    const config = parseConfig({ ...Object.fromEntries(lines), ...SECRET });
    expect(config.photoS3).toBeUndefined();
    expect(config.maxPhotoBytes).toBe(20 * 1024 * 1024);
  });

  it('a bucket switches to S3, with the endpoint, region, keys and path-style addressing given', () => {
    const config = parseConfig({
      ...SECRET, PHOTO_S3_BUCKET: 'station-photos', PHOTO_S3_ENDPOINT: 'http://127.0.0.1:9000', PHOTO_S3_REGION: 'ap-southeast-2',
      PHOTO_S3_ACCESS_KEY_ID: 'id', PHOTO_S3_SECRET_ACCESS_KEY: 'secret', PHOTO_S3_FORCE_PATH_STYLE: 'true', MAX_PHOTO_BYTES: '5000000',
    });
    expect(config.photoS3).toEqual({ bucket: 'station-photos', endpoint: 'http://127.0.0.1:9000', region: 'ap-southeast-2', accessKeyId: 'id', secretAccessKey: 'secret', forcePathStyle: true });
    expect(config.maxPhotoBytes).toBe(5_000_000);
    expect(parseConfig({ ...SECRET, PHOTO_S3_BUCKET: 'b' }).photoS3).toMatchObject({ region: 'us-east-1', endpoint: undefined, forcePathStyle: false });
  });

  it('refuses an endpoint that is not a URL and a zero size limit', () => {
    expect(() => parseConfig({ ...SECRET, PHOTO_S3_BUCKET: 'b', PHOTO_S3_ENDPOINT: 'the store on port 9000' })).toThrow(/PHOTO_S3_ENDPOINT/);
    expect(() => parseConfig({ ...SECRET, MAX_PHOTO_BYTES: '0' })).toThrow(/MAX_PHOTO_BYTES/);
  });
});
