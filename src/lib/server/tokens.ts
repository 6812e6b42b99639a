import { createHash, randomBytes } from 'node:crypto';

/** A random secret for a link or an API token; only its hash is stored. */
export function newSecret(prefix = ''): string {
	return prefix + randomBytes(32).toString('base64url');
}

export function hashSecret(secret: string): string {
	return createHash('sha256').update(secret).digest('hex');
}
