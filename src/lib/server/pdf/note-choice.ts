/** Which method notes a summary prints: plain data, so scripts can use it without the bundled notes. */
import { METHOD_NOTES } from '../../methods';
import type { Technology } from '../../technology';

/**
 * The notes a summary prints, in reading order: every note but the power
 * note of the other kind of device, the sensitivity note only beside a
 * tornado and the probabilistic-runs note only beside a run.
 */
export function summaryNoteSlugs(technology: Technology, withTornado: boolean, withRun = false): string[] {
	const otherPower = technology === 'wave' ? 'current-power' : 'wave-power';
	return METHOD_NOTES.map((n) => n.slug as string).filter(
		(slug) => slug !== otherPower && (withTornado || slug !== 'sensitivity') && (withRun || slug !== 'probabilistic-runs')
	);
}
