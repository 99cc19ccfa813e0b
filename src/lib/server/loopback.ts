/** Whether a host name or address stays on this machine (127.0.0.0/8, ::1, localhost). */
export function isLoopbackHost(host: string): boolean {
	return ['127.0.0.1', 'localhost', '::1', '[::1]'].includes(host) || /^127\.\d{1,3}\.\d{1,3}\.\d{1,3}$/.test(host);
}
