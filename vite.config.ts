import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';

export default defineConfig({
	plugins: [tailwindcss(), sveltekit()],
	server: {
		watch: { ignored: ['**/.data/**', '**/test-results/**', '**/playwright-report/**'] }
	},
	test: {
		include: ['src/**/*.test.ts'],
		environment: 'node'
	}
});
