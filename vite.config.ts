import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';

export default defineConfig({
	plugins: [tailwindcss(), sveltekit()],
	server: { host: '127.0.0.1', port: 5173, strictPort: false },
	test: {
		include: ['src/**/*.test.ts', 'tests/integration/**/*.test.ts', 'docker-local/**/*.test.ts'],
		globalSetup: ['tests/setup/global-postgres.ts'],
		testTimeout: 30_000,
		hookTimeout: 60_000,
		fileParallelism: true,
		maxWorkers: 2
	}
});
