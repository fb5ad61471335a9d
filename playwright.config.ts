import { defineConfig, devices } from '@playwright/test';

/** Browser tests run in Debian's chromium against the built app started by scripts/test.sh. */
export default defineConfig({
	testDir: 'tests/e2e',
	timeout: 60_000,
	expect: { timeout: 10_000 },
	fullyParallel: false,
	workers: 2,
	retries: 0,
	reporter: [['list']],
	use: {
		baseURL: process.env.E2E_BASE_URL ?? 'http://127.0.0.1:4173',
		trace: 'off',
		// The service worker (src/service-worker.ts) keeps the whole built app when it installs:
		// most specs leave it out, to spare the app hundreds of requests per browser; the judging
		// specs let it in (test.use({ serviceWorkers: 'allow' })), and judging-offline.spec.ts
		// runs a persistent profile of its own with it.
		serviceWorkers: 'block',
		screenshot: 'only-on-failure',
		launchOptions: {
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
		}
	},
	projects: [
		{
			name: 'laptop',
			testIgnore: [/bad-input\.spec\.ts/, /new-society\.spec\.ts/, /society-settings\.spec\.ts/],
			use: { ...devices['Desktop Chrome'], viewport: { width: 1280, height: 800 } }
		},
		{
			// Compares the whole database before and after: runs alone, after every other test.
			name: 'bad-input',
			testMatch: /bad-input\.spec\.ts/,
			dependencies: ['laptop'],
			use: { ...devices['Desktop Chrome'], viewport: { width: 1280, height: 800 } }
		},
		{
			// Changes the demo society's settings for a moment: runs alone, after every other test.
			name: 'settings',
			testMatch: /society-settings\.spec\.ts/,
			dependencies: ['bad-input'],
			use: { ...devices['Desktop Chrome'], viewport: { width: 1280, height: 800 } }
		},
		{
			// A second built app on a database with the migrations and no demo seed (scripts/test.sh).
			name: 'fresh',
			testMatch: /new-society\.spec\.ts/,
			use: {
				...devices['Desktop Chrome'],
				viewport: { width: 1280, height: 800 },
				baseURL: process.env.FRESH_BASE_URL ?? 'http://127.0.0.1:4174'
			}
		}
	]
});
