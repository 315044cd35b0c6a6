import { describe, expect, it } from 'vitest';
import { equalPeriodSchedule } from './npv';
import { gridPoints, narrow, scan, standardRange } from './scan';

describe('float64 scan', () => {
	it('lays a grid of 0.002 in ln(1 + annual rate) from −90% to +1000% a year', () => {
		const ys = gridPoints({ yLow: Math.log(1e-12), yHigh: Math.log1p(1e4) }, 1, true);
		for (let i = 1; i < ys.length; i += 1) expect(ys[i]).toBeGreaterThan(ys[i - 1]);
		const core = ys.filter((y) => y > Math.log(0.1) && y < Math.log(11));
		for (let i = 1; i < core.length; i += 1)
			expect(core[i] - core[i - 1]).toBeLessThanOrEqual(0.002);
		// Monthly rates: the same spacing per year, so 1/12 of it per month.
		const monthly = gridPoints({ yLow: -1, yHigh: 1 }, 12, true);
		expect(monthly[monthly.length - 1]).toBeCloseTo(1, 12);
		const step =
			monthly[Math.floor(monthly.length / 2) + 1] - monthly[Math.floor(monthly.length / 2)];
		expect(step).toBeLessThanOrEqual(0.002 / 12 + 1e-15);
	});

	it('separates roots two points apart and narrows each to float64 resolution', () => {
		const schedule = equalPeriodSchedule(['-1000', '2220', '-1232']); // roots 10% and 12%
		const result = scan(schedule, standardRange(schedule), true);
		expect(result.cells).toHaveLength(2);
		const roots = result.cells.map((cell) => Math.expm1(narrow(schedule, cell).y));
		expect(roots[0]).toBeCloseTo(0.1, 12);
		expect(roots[1]).toBeCloseTo(0.12, 12);
	});

	it('flags a near-zero minimum of |NPV| without a sign change', () => {
		const schedule = equalPeriodSchedule(['-1', '2', '-1']); // -(1 - v)^2
		const result = scan(schedule, standardRange(schedule), true);
		expect(result.cells).toHaveLength(0);
		expect(result.touches.length).toBeGreaterThan(0);
		expect(Math.abs(Math.expm1(result.touches[0].y))).toBeLessThan(1e-6);
	});
});
