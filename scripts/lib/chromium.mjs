// How Squarelaw drives Debian's Chromium, for the browser tests (tests/playwright.config.ts) and the
// editor bench (scripts/bench/editor.mjs): headless, sandbox off (CI runs as root), and nothing that
// would make a request leave the machine.
export const chromiumLaunchOptions = {
	executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
	args: [
		'--headless',
		'--no-sandbox',
		'--disable-gpu',
		'--disable-quic',
		'--no-first-run',
		'--disable-background-networking',
		'--disable-component-update',
		'--disable-sync'
	]
};
