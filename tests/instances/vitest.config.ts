import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

/**
 * Two instances: two built apps (`node build`) and two job workers on one PostgreSQL cluster of
 * their own, as a host runs them behind a proxy. Run from the project folder after a build:
 * npx vitest run --config tests/instances/vitest.config.ts
 */
export default defineConfig({
	root: fileURLToPath(new URL('../..', import.meta.url)),
	test: {
		include: ['tests/instances/**/*.test.ts'],
		environment: 'node',
		globalSetup: ['tests/instances/global-setup.ts'],
		fileParallelism: false,
		testTimeout: 180_000,
		hookTimeout: 180_000
	}
});
