import { json } from '@sveltejs/kit';
import { sql } from 'drizzle-orm';
import { db } from '$lib/server/db';

export async function GET() {
	try {
		await Promise.race([
			db.execute(sql`select 1`),
			new Promise((_, reject) => setTimeout(() => reject(new Error('timeout')), 3000))
		]);
		return json({ ok: true, db: 'up' });
	} catch {
		return json({ ok: true, db: 'down' }, { status: 503 });
	}
}
