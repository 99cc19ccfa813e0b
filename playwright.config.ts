import { defineConfig } from '@playwright/test';

// The browser tests run the built app against a cluster of their own, thrown
// away at the start of every run, on ports apart from `npm start`'s.
const port = Number(process.env.E2E_PORT ?? 3100);
const pgPort = Number(process.env.E2E_PG_PORT ?? 54331);
export const mailSinkSmtpPort = Number(process.env.MAIL_SINK_SMTP_PORT ?? 54335);
export const mailSinkHttpPort = Number(process.env.MAIL_SINK_HTTP_PORT ?? 54336);
export const stripeStandinPort = Number(process.env.STRIPE_STANDIN_PORT ?? 54337);
export const baseURL = `http://127.0.0.1:${port}`;
export const e2eClusterDir = `.data/pg-e2e-${pgPort}`;
export const e2ePgPort = pgPort;

export default defineConfig({
	testDir: 'tests/e2e',
	outputDir: 'test-results',
	fullyParallel: false,
	workers: 1,
	retries: 0,
	timeout: 60_000,
	expect: { timeout: 10_000 },
	reporter: [['list']],
	use: {
		baseURL,
		// The house style (9 Dec 2026, 1,234.5): the app follows the browser's languages, Chromium's default is en-US.
		locale: 'en-GB',
		trace: 'retain-on-failure',
		screenshot: 'only-on-failure',
		launchOptions: {
			executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
			args: [
				'--no-sandbox',
				'--disable-gpu',
				'--disable-dev-shm-usage',
				'--disable-background-networking',
				'--disable-component-update',
				'--disable-sync',
				'--no-first-run',
				'--disable-quic'
			]
		}
	},
	webServer: {
		command: 'npx tsx scripts/start.ts --fresh',
		url: `${baseURL}/api/v1/health`,
		timeout: 240_000,
		reuseExistingServer: false,
		stdout: 'pipe',
		stderr: 'pipe',
		gracefulShutdown: { signal: 'SIGTERM', timeout: 20_000 },
		env: {
			PORT: String(port),
			ORIGIN: baseURL,
			PGPORT_LOCAL: String(pgPort),
			PG_DATA_DIR: e2eClusterDir,
			PG_FSYNC: 'off',
			MAIL_SINK_SMTP_PORT: String(mailSinkSmtpPort),
			MAIL_SINK_HTTP_PORT: String(mailSinkHttpPort),
			STRIPE_STANDIN_PORT: String(stripeStandinPort),
			TIDEWRIGHT_E2E: '1'
		}
	}
});
