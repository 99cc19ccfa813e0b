/**
 * The local stand-ins that `npm start`, `npm run dev` and the browser tests run
 * beside the app. Each one starts, reports the settings the app needs, and stops.
 */
import { clusterSettingsFromEnv, databaseUrl, startCluster, stopCluster } from '../docker-local/postgres';
import { migrateAndSeed } from './migrate';

export interface RunningService {
	name: string;
	env: Record<string, string>;
	stop: () => Promise<void>;
}

export async function startPostgres(options: { seed?: boolean } = {}): Promise<RunningService> {
	const settings = clusterSettingsFromEnv();
	startCluster(settings);
	const url = databaseUrl(settings);
	await migrateAndSeed(url, { seed: options.seed });
	return {
		name: 'postgres',
		env: { DATABASE_URL: url },
		stop: async () => stopCluster(settings)
	};
}

/** Stand-ins started after PostgreSQL (mail sink, Stripe stand-in), in order. */
export const extraServices: Array<() => Promise<RunningService>> = [];
