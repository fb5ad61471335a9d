import { defineConfig } from 'vitest/config';

/**
 * Fault tests: the built app (`node build`) against a private PostgreSQL cluster that the tests
 * stop and restart, and an SMTP fake of their own that they stop. One file at a time.
 */
export default defineConfig({
	test: {
		include: ['tests/faults/**/*.test.ts'],
		environment: 'node',
		globalSetup: ['tests/faults/global-setup.ts'],
		fileParallelism: false,
		testTimeout: 180_000,
		hookTimeout: 180_000
	}
});
