/**
 * Assigning speeds to histogram bins of a fixed width, bins centred on whole
 * multiples of the width: with 0.1 m/s, the bin "1.2" holds speeds from 1.15
 * up to but not including 1.25. IEC TS 62600-200 bins tidal power curves by
 * 0.1 m/s (from memory: bin centres on multiples of the width, as IEC 61400-12-1
 * does for wind).
 */
import { Decimal, type DecimalInput } from '../engine/decimal';

export const DEFAULT_BIN_WIDTH_M_S = '0.1';

export interface BinIndexer {
	width: Decimal;
	/** Bin number k for a speed; the bin's centre is k x width. */
	indexOf(speed: number, speedText: string): number;
	centreOf(index: number): Decimal;
}

/**
 * Floats decide the bin except within a hair of a bin edge, where decimal
 * arithmetic on the cell's own text decides, so "1.15" always lands in the
 * 1.2 bin however the float rounds.
 */
export function binIndexer(width: DecimalInput): BinIndexer {
	const w = new Decimal(width);
	const wFloat = w.toNumber();
	return {
		width: w,
		indexOf(speed, speedText) {
			const shifted = speed / wFloat + 0.5;
			const k = Math.floor(shifted);
			if (Math.abs(shifted - Math.round(shifted)) > 1e-7) return k;
			return new Decimal(speedText).div(w).plus(0.5).floor().toNumber();
		},
		centreOf(index) {
			return w.times(index);
		}
	};
}
