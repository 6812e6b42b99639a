import { defineConfig } from '@playwright/test';
import { chromiumLaunchOptions } from '../scripts/lib/chromium.mjs';

const baseURL = process.env.TEST_BASE_URL;
if (!baseURL) throw new Error('TEST_BASE_URL is not set: run the browser tests through `npm test`.');

export default defineConfig({
	testDir: '.',
	testMatch: '**/*.spec.ts',
	fullyParallel: false,
	workers: 1,
	retries: 0,
	timeout: 60_000,
	expect: { timeout: 10_000 },
	reporter: [['list'], ['json']],
	outputDir: '../test-results',
	use: {
		baseURL,
		trace: 'retain-on-failure',
		screenshot: 'only-on-failure',
		launchOptions: chromiumLaunchOptions
	}
});
