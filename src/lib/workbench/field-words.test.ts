import { describe, expect, it } from 'vitest';
import { tidalDocument } from '../../../tests/fixtures/scenario-documents';
import { fieldWords, keyPath, pathWords, schemaWords, sectionWords } from './field-words';

const noPage = { labelOf: () => null };

describe('keyPath', () => {
	it('reads an issue path back into keys and row numbers', () => {
		expect(keyPath('capex.lines[2].amount')).toEqual(['capex', 'lines', 2, 'amount']);
		expect(keyPath('')).toEqual([]);
	});
});

describe('pathWords', () => {
	it('splits camel case and counts rows from 1', () => {
		expect(pathWords('revenue.tariffPerMWh')).toBe('revenue › tariff per MWh');
		expect(pathWords('capex.lines[0].amount')).toBe('capex › lines › row 1 › amount');
		expect(pathWords('device.cutInSpeedMPerS')).toBe('device › cut in speed M per S');
		expect(pathWords('site.waterDensityKgPerM3')).toBe('site › water density kg per M3');
		expect(pathWords('device.ratedPowerKW')).toBe('device › rated power KW');
	});
});

describe('schemaWords', () => {
	it('cuts the schema description to its name', () => {
		// From the schema's own describe() texts (src/lib/schemas/scenario.ts).
		expect(schemaWords(['capex', 'lines'], tidalDocument)).toBe('Capital cost lines');
		expect(schemaWords(['resource', 'bins'], tidalDocument)).toBe('Flow speed histogram');
		expect(schemaWords(['nowhere'], tidalDocument)).toBeNull();
	});
});

describe('fieldWords', () => {
	it('prefers the label the page gives the input', () => {
		const labelOf = (id: string) => (id === 'field-capex-lines-1-amount' ? 'Amount of capex line 2' : null);
		expect(fieldWords('capex.lines[1].amount', { labelOf, document: tidalDocument })).toBe('Amount of capex line 2');
	});

	it('falls back to the schema, a row named by its list, then to the path', () => {
		expect(fieldWords('capex.contingency', { ...noPage, document: tidalDocument })).toBe('Contingency added to every capex line');
		expect(fieldWords('capex.lines[1].amount', { ...noPage, document: tidalDocument })).toBe('Capital cost lines, row 2: amount');
		expect(fieldWords('capex.contingency', noPage)).toBe('capex › contingency');
		expect(fieldWords('', noPage)).toBe('The scenario');
	});
});

describe('sectionWords', () => {
	it('takes the heading the page gives, else the section of the document part', () => {
		expect(sectionWords('capex.lines[0].amount', () => 'Costs shown here')).toBe('Costs shown here');
		expect(sectionWords('capex.lines[0].amount', () => null)).toBe('Capital costs');
		expect(sectionWords('decommissioning.amount', () => null)).toBe('Operating costs');
		expect(sectionWords('somethingNew.value', () => null)).toBe('something new');
	});
});
