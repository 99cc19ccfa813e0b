import { describe, expect, it } from 'vitest';
import { tidalDocument } from '../../../../tests/fixtures/scenario-documents';
import { Decimal } from '../engine/decimal';
import { evaluateScenario, type EngineResult } from '../engine/evaluate';
import type { Scenario } from '../../schemas/scenario';
import { cashFlowTable } from './export-tables';

const debt = tidalDocument.finance.debt;
if (debt.sizing !== 'gearing') throw new Error('the tidal fixture is geared');
const withFees: Scenario = { ...tidalDocument, finance: { ...tidalDocument.finance, debt: { ...debt, upfrontFee: 0.02, commitmentFee: 0.005 } } };

describe('cashFlowTable', () => {
	const result = evaluateScenario(withFees);
	const table = cashFlowTable(result);
	const column = table.headers.indexOf('Financing fees (commitment and upfront) (EUR, nominal)');

	it('has a financing-fees column after interest, holding the construction years’ commitment and upfront fees', () => {
		expect(column).toBe(table.headers.indexOf('Interest (EUR, nominal)') + 1);
		expect(table.numeric[column]).toBe(true);
		const construction = table.rows.filter((_, i) => result.cashFlow[i].phase === 'construction');
		const operation = table.rows.filter((_, i) => result.cashFlow[i].phase === 'operation');
		// The fees paid in the construction years add up to the financing block's commitment fees plus the upfront fee.
		const total = construction.reduce((sum, row) => sum.plus(String(row[column])), new Decimal(0));
		const financing = result.financing!;
		expect(total.minus(new Decimal(financing.commitmentFees).plus(financing.upfrontFee)).abs().lt(1e-6)).toBe(true);
		expect(total.gt(0)).toBe(true);
		expect(operation.every((row) => row[column] === '0')).toBe(true);
	});

	it('leaves the cells empty for a result stored before the column existed', () => {
		const stored = { ...result, cashFlow: result.cashFlow.map(({ financingFees: _, ...row }) => row) } as unknown as EngineResult;
		expect(cashFlowTable(stored).rows.every((row) => row[column] === null)).toBe(true);
	});
});
