import { describe, expect, it } from 'vitest';
import { equalPeriodSchedule } from './npv';
import { uniqueness } from './uniqueness';

describe('root-count tests', () => {
	it('pump project (Lorie and Savage 1955): two sign changes, no uniqueness', () => {
		const report = uniqueness(equalPeriodSchedule(['-1600', '10000', '-10000']));
		expect(report.signChanges).toBe(2);
		expect(report.cumulativeSignChanges).toBe(2); // -1600, 8400, -1600
		expect(report.holds).toEqual([]);
		expect(report.maxRoots).toBe(2);
	});

	it('a conventional investment satisfies both Descartes and Norström', () => {
		const report = uniqueness(equalPeriodSchedule(['-1000', '300', '400', '500']));
		expect(report.holds).toEqual(['descartes', 'norstrom']);
		expect(report.maxRoots).toBe(1);
	});

	it('Norström with later costs: many flow sign changes, one cumulative change', () => {
		const report = uniqueness(equalPeriodSchedule(['-1000', '600', '-50', '600', '-50', '300']));
		expect(report.signChanges).toBe(5);
		expect(report.cumulativeSignChanges).toBe(1);
		expect(report.reverseCumulativeSignChanges).toBe(0);
		expect(report.holds).toEqual(['norstrom']);
		expect(report.maxRoots).toBe(1);
	});

	it('zeros do not count as sign changes', () => {
		expect(uniqueness(equalPeriodSchedule(['-5', '0', '0', '7'])).signChanges).toBe(1);
	});
});
