// The local storage fake: s3rver, an S3-compatible server on loopback keeping its objects under
// .data/, for `npm start`, `npm test` and the bench. Never used in production (README, "Past one machine").
import fs from 'node:fs';
import path from 'node:path';
import { dataDir } from './bootstrap.mjs';

export const FAKE_BUCKET = 'squarelaw-shots';
/** s3rver's fixed key pair. */
export const FAKE_CREDENTIALS = { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' };

export async function startStorageFake({ port, name, host = '127.0.0.1' }) {
	const S3rver = (await import('s3rver')).default;
	const directory = path.join(dataDir, `s3-${name}`);
	fs.mkdirSync(directory, { recursive: true });
	const server = new S3rver({ address: host, port, directory, silent: true, configureBuckets: [{ name: FAKE_BUCKET }] });
	await server.run();
	const endpoint = `http://${host}:${port}`;
	return {
		endpoint,
		env: {
			S3_ENDPOINT: endpoint,
			S3_BUCKET: FAKE_BUCKET,
			S3_REGION: 'us-east-1',
			S3_ACCESS_KEY_ID: FAKE_CREDENTIALS.accessKeyId,
			S3_SECRET_ACCESS_KEY: FAKE_CREDENTIALS.secretAccessKey,
			S3_FORCE_PATH_STYLE: '1'
		},
		stop: () => server.close().catch(() => {})
	};
}
