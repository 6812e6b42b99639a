// Shots bench. Signed in as the seeded Mara Quill (a session row made here), on one of her studio's
// setups: (1) uploading a 24-megapixel JPEG through the product (stored, EXIF read, thumbnail and preview
// made) against a bare PutObject of the same bytes to the same storage, in alternating rounds; goal: time
// ratio ≤ 3. (2) Eight such uploads at once: the app server's peak RSS (sampled from /proc) under 700 MB,
// and all eight stored. (3) Measuring a region of the 24-megapixel original: p95 ≤ 300 ms.
import fs from 'node:fs';
import { createHash, randomBytes } from 'node:crypto';
import { PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import postgres from 'postgres';
import sharp from 'sharp';

const SEEDED_USER = 'mara.quill@fernhill.example';
const ROUNDS = Number(process.env.SQUARELAW_BENCH_SHOT_ROUNDS ?? 4);
const MEASURES = Number(process.env.SQUARELAW_BENCH_MEASURES ?? 20);
export const GOALS = { uploadRatio: 3, peakRssMb: 700, measureP95Ms: 300 };

const percentile = (values, p) => [...values].sort((a, b) => a - b)[Math.min(values.length - 1, Math.ceil((p / 100) * values.length) - 1)];

function rssMb(pid) {
	const m = /VmRSS:\s+(\d+) kB/.exec(fs.readFileSync(`/proc/${pid}/status`, 'utf8'));
	return m ? Number(m[1]) / 1024 : 0;
}

export async function run({ baseUrl, databaseUrl, env, appPid, log = console.log }) {
	const sql = postgres(databaseUrl, { max: 1, onnotice: () => {} });
	const token = randomBytes(32).toString('hex');
	try {
		const [user] = await sql`select id from users where email = ${SEEDED_USER}`;
		if (!user) throw new Error(`the seed has no ${SEEDED_USER}`);
		await sql`insert into sessions (session_token, user_id, expires) values (${createHash('sha256').update(token).digest('hex')}, ${user.id}, now() + interval '1 hour')`;
		const [setup] = await sql`
			select s.id from setups s join memberships m on m.studio_id = s.studio_id and m.user_id = ${user.id} and m.role in ('owner', 'editor')
			where s.deleted_at is null order by s.created_at limit 1`;
		const headers = { cookie: `authjs.session-token=${token}`, origin: baseUrl };
		const shotsUrl = new URL(`/api/v1/setups/${setup.id}/shots`, baseUrl).href;

		// 6000 × 4000 of noise (24 megapixels) with EXIF, as a camera's JPEG would be.
		const jpeg = await sharp({ create: { width: 6000, height: 4000, channels: 3, noise: { type: 'gaussian', mean: 118, sigma: 20 } } })
			.jpeg({ quality: 90 })
			.withExif({ IFD0: { Model: 'Bench Camera' }, IFD2: { FNumber: '16/1', ExposureTime: '1/125', ISOSpeedRatings: '100' } })
			.toBuffer();
		log(`a 6000 × 4000 JPEG of ${(jpeg.length / 1e6).toFixed(1)} MB`);

		const upload = async (name) => {
			const form = new FormData();
			form.append('files', new Blob([jpeg], { type: 'image/jpeg' }), name);
			const res = await fetch(shotsUrl, { method: 'POST', headers, body: form });
			const body = await res.json();
			if (res.status !== 201) throw new Error(`upload answered ${res.status}: ${JSON.stringify(body).slice(0, 300)}`);
			return body.created[0].id;
		};
		const s3 = new S3Client({
			endpoint: env.S3_ENDPOINT,
			region: env.S3_REGION,
			forcePathStyle: true,
			credentials: { accessKeyId: env.S3_ACCESS_KEY_ID, secretAccessKey: env.S3_SECRET_ACCESS_KEY },
			requestChecksumCalculation: 'WHEN_REQUIRED',
			responseChecksumValidation: 'WHEN_REQUIRED'
		});
		const bare = (key) => s3.send(new PutObjectCommand({ Bucket: env.S3_BUCKET, Key: key, Body: jpeg, ContentType: 'image/jpeg' }));
		const timed = async (fn) => {
			const t = performance.now();
			await fn();
			return performance.now() - t;
		};

		// (1) Alternating rounds after one warm-up of each.
		await upload('warm-up.jpg');
		await bare('bench/warm-up');
		const product = [];
		const plain = [];
		for (let i = 0; i < ROUNDS; i++) {
			product.push(await timed(() => upload(`round-${i}.jpg`)));
			plain.push(await timed(() => bare(`bench/round-${i}`)));
		}
		const median = (v) => percentile(v, 50);
		const uploadRatio = median(product) / median(plain);
		log(`upload through the product: median ${median(product).toFixed(0)} ms; bare PutObject: ${median(plain).toFixed(0)} ms; ratio ${uploadRatio.toFixed(2)} (goal ≤ ${GOALS.uploadRatio})`);
		log(`  each round (ms): product ${product.map((t) => t.toFixed(0)).join(' ')}; bare ${plain.map((t) => t.toFixed(0)).join(' ')}`);
		// The floor under the ratio: the preview alone, made here from the same bytes as the server makes it
		// (every coefficient of the JPEG is decoded even when libvips shrinks on load).
		const preview = [];
		for (let i = 0; i < ROUNDS; i++) {
			preview.push(await timed(() => sharp(jpeg, { failOn: 'warning', sequentialRead: true }).rotate().resize(1600, 1600, { fit: 'inside' }).jpeg({ quality: 85 }).toBuffer()));
		}
		log(`  the 1600 px preview alone, made in this process: median ${median(preview).toFixed(0)} ms, ${(median(preview) / median(plain)).toFixed(1)} × the bare PutObject`);

		// (2) Eight at once, RSS sampled every 10 ms.
		let peak = appPid ? rssMb(appPid) : 0;
		const sampler = appPid ? setInterval(() => (peak = Math.max(peak, rssMb(appPid))), 10) : null;
		const before = (await sql`select count(*)::int as n from shots where setup_id = ${setup.id} and deleted_at is null`)[0].n;
		const results = await Promise.allSettled(Array.from({ length: 8 }, (_, i) => upload(`eight-${i}.jpg`)));
		if (sampler) clearInterval(sampler);
		const after = (await sql`select count(*)::int as n from shots where setup_id = ${setup.id} and deleted_at is null`)[0].n;
		const stored = results.filter((r) => r.status === 'fulfilled').length;
		log(`eight uploads at once: ${stored} of 8 answered 201, ${after - before} rows added; app server peak RSS ${peak.toFixed(0)} MB (goal < ${GOALS.peakRssMb})`);

		// (3) Measuring a region of the original.
		const shotId = await upload('measure.jpg');
		const measureUrl = `${shotsUrl}/${shotId}/measure`;
		const times = [];
		for (let i = 0; i < MEASURES; i++) {
			times.push(
				await timed(async () => {
					const res = await fetch(measureUrl, {
						method: 'POST',
						headers: { ...headers, 'content-type': 'application/json' },
						body: JSON.stringify({ method: 'region', region: { x: 0.4, y: 0.4, width: 0.05 + (i % 3) * 0.01, height: 0.05 } })
					});
					if (res.status !== 200) throw new Error(`measure answered ${res.status}`);
					await res.arrayBuffer();
				})
			);
		}
		const measureP95Ms = percentile(times, 95);
		log(`measure a region of the 24-megapixel original: p95 ${measureP95Ms.toFixed(0)} ms over ${MEASURES} (goal ≤ ${GOALS.measureP95Ms})`);

		return {
			uploadMedianMs: median(product),
			putObjectMedianMs: median(plain),
			previewAloneMedianMs: median(preview),
			uploadRatio,
			eightAtOnce: { answered201: stored, rowsAdded: after - before, peakRssMb: appPid ? peak : null },
			measureP95Ms,
			goalsMet: {
				uploadRatio: uploadRatio <= GOALS.uploadRatio,
				peakRss: appPid ? peak < GOALS.peakRssMb : null,
				nothingLost: stored === 8 && after - before === 8,
				measureP95: measureP95Ms <= GOALS.measureP95Ms
			}
		};
	} finally {
		await sql.end();
	}
}
