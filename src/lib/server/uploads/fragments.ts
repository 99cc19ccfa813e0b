/**
 * What each upload produces: a piece of the scenario document, ready to drop
 * in as `resource` or `device` (see src/lib/schemas/scenario.ts).
 */
import type { DeviceSpec, Resource } from '../../schemas/scenario';
import type { Decimal } from '../engine/decimal';

export type SpeedHistogramResource = Extract<Resource, { kind: 'speed-histogram' }>;
export type SeaStateTableResource = Extract<Resource, { kind: 'sea-state-table' }>;
export type PowerCurveDevice = Extract<DeviceSpec, { kind: 'power-curve' }>;
export type PowerMatrixDevice = Extract<DeviceSpec, { kind: 'power-matrix' }>;

/** The scenario's default Te/Tp ratio for peak periods (the usual 0.9 rule). */
export const DEFAULT_TE_OVER_TP = 0.9;

/** Decimal strings in plain notation (never exponent form) for summaries. */
export function plain(value: Decimal): string {
	return value.toFixed();
}
