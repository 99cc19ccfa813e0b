/** `$env/dynamic/private` for scripts run with tsx outside SvelteKit: the process environment. */
export const env: Record<string, string | undefined> = process.env;
