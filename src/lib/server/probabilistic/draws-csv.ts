/**
 * A run's draws as CSV, one row a draw: its index (the i that, with the
 * seed, decides it: 0 to draws - 1), each drawn driver in the run's order,
 * the energy factor, each output; an empty cell where a draw has no value.
 * Numbers are rounded to 10 significant digits and written as plain decimals
 * (no exponent, no 1.3499999999 float noise). Pure: no I/O.
 */
import type { ProbabilisticDriverId } from '../../schemas/probabilistic';
import { RUN_OUTPUTS } from './draw-evaluation';
import type { RunDraws } from './summary';

/** "1.234e-7" -> "0.0000001234", "1e+21" -> "1000000000000000000000"; other text unchanged. */
function withoutExponent(text: string): string {
	const match = /^(-?)(\d)(?:\.(\d+))?e([+-]\d+)$/.exec(text);
	if (!match) return text;
	const [, sign, lead, fraction = '', exponentText] = match;
	const exponent = Number(exponentText);
	const digits = lead + fraction;
	if (exponent < 0) return `${sign}0.${'0'.repeat(-exponent - 1)}${digits}`;
	if (digits.length <= exponent + 1) return sign + digits + '0'.repeat(exponent + 1 - digits.length);
	return `${sign}${digits.slice(0, exponent + 1)}.${digits.slice(exponent + 1)}`;
}

/** A number for a CSV cell: 10 significant digits, plain decimal; empty for none. */
export function csvNumber(value: number | null | undefined): string {
	if (value === null || value === undefined || !Number.isFinite(value)) return '';
	return withoutExponent(String(Number(value.toPrecision(10))));
}

/** The CSV of chunks of draws, each given with the index of its first draw, in draw order. */
export function drawsCsvText(chunks: readonly { firstDraw: number; draws: RunDraws }[], drivers: readonly ProbabilisticDriverId[]): string {
	const header = ['draw', ...drivers, 'energyFactor', ...RUN_OUTPUTS];
	const lines = [header.join(',')];
	for (const { firstDraw, draws } of chunks) {
		for (let i = 0; i < draws.energyFactor.length; i++) {
			const cells = [
				String(firstDraw + i),
				...drivers.map((d) => csvNumber(draws.drivers[d]?.[i])),
				csvNumber(draws.energyFactor[i]),
				...RUN_OUTPUTS.map((key) => csvNumber(draws.outputs[key][i]))
			];
			lines.push(cells.join(','));
		}
	}
	return lines.join('\r\n') + '\r\n';
}
