import { sveltekit } from '@sveltejs/kit/vite';
import { defineConfig } from 'vitest/config';

/** Integration tests: real PostgreSQL (DATABASE_URL), one file at a time since they share it. */
export default defineConfig({
	plugins: [sveltekit()],
	test: {
		include: ['tests/integration/**/*.test.ts'],
		environment: 'node',
		globalSetup: ['tests/integration/global-setup.ts'],
		fileParallelism: false,
		testTimeout: 60_000,
		hookTimeout: 120_000
	}
});
