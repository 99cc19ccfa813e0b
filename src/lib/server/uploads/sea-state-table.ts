/**
 * Wave sea-state table upload, long format: one row per sea state,
 * `hs_m,te_s,hours` (or `probability`; or `tp_s` for spectral peak periods,
 * which the engine converts with the scenario's Te/Tp ratio). Produces the
 * scenario's `sea-state-table` resource. A sea state (Hs, period) may appear
 * only once; row order does not matter.
 */
import { Decimal } from '../engine/decimal';
import { readCsvTable, resolveColumns } from './csv';
import { DEFAULT_MAX_BYTES } from './decode';
import { numberAt } from './fields';
import { beyondScenarioLimit } from './limits';
import { DEFAULT_TE_OVER_TP, plain, type SeaStateTableResource } from './fragments';
import {
	checkOccurrenceTotal,
	DEFAULT_PROBABILITY_TOLERANCE,
	readOccurrence,
	shares,
	type Occurrence,
	type OccurrenceBasis
} from './occurrence';
import { ErrorCollector, failure, type UploadResult } from './result';
import { DEFAULT_TABLE_MAX_ROWS } from './speed-histogram';

export const SEA_STATE_TABLE_HEADER = ['hs_m', 'te_s', 'hours'] as const;

export interface SeaStateTableOptions {
	maxBytes?: number;
	maxRows?: number;
	/** How far from 1 the probabilities may sum before the upload is refused (default 0.01). */
	probabilityTolerance?: number;
}

export interface SeaStateTableSummary {
	stateCount: number;
	periodType: 'energy-period' | 'peak-period';
	occurrenceBasis: OccurrenceBasis;
	/** Sum of the occurrence column: hours, or probabilities as given. */
	occurrenceTotal: string;
	hsValues: number;
	periodValues: number;
	minHsM: string;
	maxHsM: string;
	minPeriodS: string;
	maxPeriodS: string;
	/** The sea state with the largest share of time. */
	mostFrequent: { hsM: string; periodS: string; share: string };
}

interface StateRow {
	row: number;
	hs: Decimal;
	period: Decimal;
	occurrence: Occurrence;
}

export function parseSeaStateTableCsv(
	bytes: Uint8Array,
	options: SeaStateTableOptions = {}
): UploadResult<SeaStateTableResource, SeaStateTableSummary> {
	const read = readCsvTable(bytes, {
		maxBytes: options.maxBytes ?? DEFAULT_MAX_BYTES,
		maxRows: options.maxRows ?? DEFAULT_TABLE_MAX_ROWS
	});
	if (!read.ok) return read;
	const { table } = read;
	const tooMany = beyondScenarioLimit('seaStates', table.rows.length, 'rows (one sea state each)');
	if (tooMany) return tooMany;
	const resolved = resolveColumns(
		table,
		{ required: ['hs_m'], oneOf: [['te_s', 'tp_s'], ['hours', 'probability']] },
		SEA_STATE_TABLE_HEADER
	);
	if (!resolved.ok) return resolved;
	const { byName, chosen } = resolved.columns;
	const periodType = chosen[0] === 'tp_s' ? 'peak-period' : 'energy-period';
	const basis = chosen[1] as OccurrenceBasis;
	const hsColumn = byName.get('hs_m')!;
	const periodColumn = byName.get(chosen[0])!;
	const occurrenceColumn = byName.get(basis)!;
	const warnings = [...resolved.columns.warnings];
	if (periodType === 'peak-period') {
		warnings.push(
			`Periods are peak periods Tp; energy is computed with Te = ${DEFAULT_TE_OVER_TP} x Tp unless the scenario sets another ratio.`
		);
	}

	const errors = new ErrorCollector();
	const states: StateRow[] = [];
	const firstRowOfState = new Map<string, number>();
	for (const r of table.rows) {
		const hs = numberAt(r, hsColumn, table.decimalComma, errors, { what: 'a wave height', min: 0 });
		const period = numberAt(r, periodColumn, table.decimalComma, errors, {
			what: 'a wave period',
			min: 0,
			exclusiveMin: true
		});
		const occurrence = readOccurrence(r, occurrenceColumn, basis, table.decimalComma, errors);
		if (!hs || !period) continue;
		const key = `${hs.value}|${period.value}`;
		const earlier = firstRowOfState.get(key);
		if (earlier !== undefined) {
			errors.add(
				r.row,
				hsColumn.name,
				`the sea state Hs ${hs.text} m, ${periodColumn.name === 'tp_s' ? 'Tp' : 'Te'} ${period.text} s already appears on row ${earlier}.`
			);
			continue;
		}
		firstRowOfState.set(key, r.row);
		if (!occurrence) continue;
		states.push({ row: r.row, hs: new Decimal(hs.text), period: new Decimal(period.text), occurrence });
	}
	if (errors.hasErrors) return errors.toFailure();

	const occurrences = states.map((s) => s.occurrence);
	const total = checkOccurrenceTotal(
		occurrences,
		basis,
		occurrenceColumn,
		options.probabilityTolerance ?? DEFAULT_PROBABILITY_TOLERANCE,
		warnings
	);
	if (!total.ok) return failure([total.error]);
	const p = shares(occurrences, total.total);

	let top = 0;
	p.forEach((share, i) => {
		if (share.greaterThan(p[top])) top = i;
	});
	const hsSorted = [...states].sort((a, b) => a.hs.comparedTo(b.hs));
	const periodSorted = [...states].sort((a, b) => a.period.comparedTo(b.period));

	return {
		ok: true,
		data: {
			kind: 'sea-state-table',
			periodType,
			teOverTp: DEFAULT_TE_OVER_TP,
			occurrenceBasis: basis,
			states: states.map((s) => ({
				hsM: s.hs.toNumber(),
				periodS: s.period.toNumber(),
				occurrence: s.occurrence.value
			}))
		},
		summary: {
			stateCount: states.length,
			periodType,
			occurrenceBasis: basis,
			occurrenceTotal: plain(total.total),
			hsValues: new Set(states.map((s) => s.hs.toString())).size,
			periodValues: new Set(states.map((s) => s.period.toString())).size,
			minHsM: plain(hsSorted[0].hs),
			maxHsM: plain(hsSorted[hsSorted.length - 1].hs),
			minPeriodS: plain(periodSorted[0].period),
			maxPeriodS: plain(periodSorted[periodSorted.length - 1].period),
			mostFrequent: {
				hsM: plain(states[top].hs),
				periodS: plain(states[top].period),
				share: plain(p[top])
			}
		},
		warnings
	};
}
