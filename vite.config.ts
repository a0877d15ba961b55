import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';

// One Vitest run, three projects. `npm test` (scripts/test.ts) sets up PostgreSQL, the fakes and a
// built server first and passes their addresses in the environment; see DEVELOPERS.md.
export default defineConfig({
	plugins: [tailwindcss(), sveltekit()],
	build: { rolldownOptions: { checks: { bundlerTimings: false } } },
	server: { host: '127.0.0.1' },
	test: {
		projects: [
			{
				extends: true,
				test: { name: 'unit', include: ['src/**/*.test.ts'], environment: 'node', benchmark: { include: ['bench/**/*.bench.ts'] } }
			},
			{
				extends: true,
				test: {
					name: 'integration',
					include: ['tests/integration/**/*.test.ts'],
					exclude: ['tests/integration/faults.test.ts'],
					environment: 'node',
					setupFiles: ['tests/integration/require-stack.ts'],
					fileParallelism: false,
					sequence: { groupOrder: 1 },
					testTimeout: 20_000
				}
			},
			{
				extends: true,
				test: {
					name: 'e2e',
					include: ['tests/e2e/**/*.test.ts'],
					environment: 'node',
					fileParallelism: false,
					sequence: { groupOrder: 1 },
					testTimeout: 60_000,
					hookTimeout: 60_000
				}
			},
			{
				// Stops and starts the shared PostgreSQL cluster: alone, after every other file.
				extends: true,
				test: {
					name: 'faults',
					include: ['tests/integration/faults.test.ts'],
					environment: 'node',
					setupFiles: ['tests/integration/require-stack.ts'],
					fileParallelism: false,
					sequence: { groupOrder: 2 },
					testTimeout: 120_000,
					hookTimeout: 60_000
				}
			}
		]
	}
});
