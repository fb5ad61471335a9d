import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

/**
 * Fault tests: the built app (`node build`) against a private PostgreSQL cluster that the tests
 * stop and restart, and an SMTP fake of their own that they stop. One file at a time.
 * Run from the project folder: npx vitest run --config tests/faults/vitest.config.ts
 */
export default defineConfig({
	root: fileURLToPath(new URL('../..', import.meta.url)),
	test: {
		include: ['tests/faults/**/*.test.ts'],
		environment: 'node',
		globalSetup: ['tests/faults/global-setup.ts'],
		fileParallelism: false,
		testTimeout: 180_000,
		hookTimeout: 180_000
	}
});
