import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';

export default defineConfig({
	plugins: [tailwindcss(), sveltekit()],
	server: { host: '127.0.0.1' },
	test: {
		include: ['src/**/*.test.ts'],
		environment: 'node',
		// Integration tests share one real database; files run one after another.
		fileParallelism: false,
		testTimeout: 30_000,
		hookTimeout: 60_000
	}
});
