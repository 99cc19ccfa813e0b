/**
 * Settings for app modules that read `$env/dynamic/private` (the `db()`
 * singleton, the mailer, the dev inbox). Under Vitest that module is a copy of
 * the environment taken when Vite started, not `process.env`, so a test that
 * points the app at its own database or mail sink sets both.
 */
import { env } from '$env/dynamic/private';

export function setAppEnv(values: Record<string, string>): void {
	const appEnv = env as Record<string, string | undefined>;
	for (const [key, value] of Object.entries(values)) {
		process.env[key] = value;
		appEnv[key] = value;
	}
}
