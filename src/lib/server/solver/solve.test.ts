import * as formulajs from '@formulajs/formulajs';
import Decimal from 'decimal.js';
import * as financial from 'financial';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { solve } from './solve';

// Independent evaluation of equal-period NPV: a direct sum at 60 digits.
const Wide = Decimal.clone({ precision: 60 });
const directNpv = (flows: readonly string[], rate: string) =>
	flows.reduce(
		(sum, flow, k) => sum.plus(new Wide(flow).div(new Wide(1).plus(rate).pow(k))),
		new Wide(0)
	);
const sign = (value: Decimal) => (value.isZero() ? 0 : value.isNeg() ? -1 : 1);

describe('published IRR cases', () => {
	it('Lorie and Savage (1955) pump project −1600, 10000, −10000 → 25% and 400%', () => {
		const result = solve({ kind: 'irr', flows: ['-1600', '10000', '-10000'] });
		expect(result.status).toBe('multiple-roots');
		expect(result.rate).toBeNull();
		expect(result.roots.map((r) => Number(r.rate))).toEqual([
			expect.closeTo(0.25, 12),
			expect.closeTo(4, 12)
		]);
		for (const [root, exact] of result.roots.map((r, i) => [r, ['0.25', '4'][i]] as const)) {
			expect(
				new Wide(root.certificate.low).lte(exact) && new Wide(root.certificate.high).gte(exact)
			).toBe(true);
			expect(sign(new Wide(root.npvAtLow)) * sign(new Wide(root.npvAtHigh))).toBe(-1);
		}
	});

	it('Brealey and Myers: 1000, −3000, 2500 has no IRR', () => {
		const result = solve({ kind: 'irr', flows: ['1000', '-3000', '2500'] });
		expect(result.status).toBe('no-root');
		expect(result.rate).toBeNull();
		expect(result.reason?.code).toBe('no-sign-change');
		// NPV = 2500v² − 3000v + 1000 is smallest at v = 0.6 (r = 2/3), where it equals 100.
		expect(Number(result.reason?.closest?.rate)).toBeCloseTo(2 / 3, 6);
		expect(Number(result.reason?.closest?.npv)).toBeCloseTo(100, 6);
	});
});

describe('statuses, reasons and warnings', () => {
	it('explains flows of one sign and flows that are all zero', () => {
		expect(solve({ kind: 'irr', flows: ['100', '0', '300'] }).reason?.code).toBe('one-sign');
		expect(solve({ kind: 'irr', flows: ['0', '0'] }).reason?.code).toBe('all-zero');
	});

	it('warns of a touching root instead of calling it no root silently', () => {
		const result = solve({ kind: 'irr', flows: ['-1', '2', '-1'] });
		expect(result.status).toBe('no-root');
		expect(result.warnings.map((w) => w.code)).toContain('touching-root-suspected');
		expect(result.reason?.message).toMatch(/touching root/);
	});

	it('finds two roots inside one grid cell by splitting at the |NPV| minimum', () => {
		// Roots at 10% and 10.01%: closer than the grid spacing.
		const result = solve({ kind: 'irr', flows: ['-1000', '2200.1', '-1210.11'] });
		expect(result.roots.map((r) => Number(r.rate))).toEqual([
			expect.closeTo(0.1, 12),
			expect.closeTo(0.1001, 12)
		]);
	});

	it('warns when the residual rule stands alone, and when the cap stops early', () => {
		const residual = solve({
			kind: 'irr',
			flows: ['-100', '60', '60'],
			stop: { residualTolerance: '0.01' }
		});
		expect(residual.warnings.map((w) => w.code)).toContain('residual-rule-alone');
		expect(residual.roots[0].stoppedBy).toBe('residual-tolerance');
		const capped = solve({
			kind: 'irr',
			flows: ['-100', '60', '60'],
			bracket: { low: '0', high: '1' },
			stop: { maxIterations: 3 }
		});
		expect(capped.stoppedBy).toBe('iteration-cap');
		expect(capped.warnings.map((w) => w.code)).toContain('iteration-cap');
	});

	it('reports the sign-change allowance when fewer roots are found', () => {
		// (1 − 1.1v)(1 + v²)·(−1): one real root, Descartes allows three.
		const result = solve({ kind: 'irr', flows: ['-1', '1.1', '-1', '1.1'] });
		expect(result.status).toBe('solved');
		expect(result.warnings.map((w) => w.code)).toContain('more-roots-possible');
	});

	it('scans inside an explicit bracket whose ends share a sign', () => {
		const result = solve({
			kind: 'irr',
			flows: ['-1600', '10000', '-10000'],
			bracket: { low: '0.1', high: '5' }
		});
		expect(result.roots).toHaveLength(2);
		expect(result.warnings.map((w) => w.code)).toContain('bracket-same-sign');
	});

	it('ITP needs fewer steps than bisection on the same bracket and stays within its bound', () => {
		const request = {
			kind: 'irr' as const,
			flows: ['-1000', '300', '400', '500'],
			bracket: { low: '0', high: '1' }
		};
		const byBisection = solve({ ...request, method: 'bisection' });
		const byItp = solve({ ...request, method: 'itp' });
		expect(byBisection.iterations).toBe(byBisection.predictedIterations);
		expect(byItp.iterations).toBeLessThan(byBisection.iterations);
		expect(byItp.iterations).toBeLessThanOrEqual(byItp.roots[0].iterationBound ?? 0);
		expect(Math.abs(Number(byItp.rate) - Number(byBisection.rate))).toBeLessThan(2e-12);
	});

	it('solves near −100% and far above 1000% per period', () => {
		expect(Number(solve({ kind: 'irr', flows: ['-1000', '0.001'] }).rate)).toBeCloseTo(
			-0.999999,
			15
		);
		expect(Number(solve({ kind: 'irr', flows: ['-1', '5000'] }).rate)).toBeCloseTo(4999, 8);
	});
});

describe('properties', () => {
	it('random conventional loans: certificate ends differ in sign, the rate is within its bound', () => {
		fc.assert(
			fc.property(
				fc.integer({ min: 1000, max: 100_000 }),
				fc.integer({ min: 2, max: 72 }),
				fc.integer({ min: 1, max: 400 }),
				(principal, count, basisPoints) => {
					const i = basisPoints / 120_000; // monthly rate for 0.01% to 40% a year
					const payment = ((principal * i) / (1 - (1 + i) ** -count)).toFixed(2);
					const flows = [String(-principal), ...Array.from({ length: count }, () => payment)];
					const payments = flows.slice(1).map((amount, k) => ({
						date: new Date(Date.UTC(2024, 1 + k, 5)).toISOString().slice(0, 10),
						amount
					}));
					const result = solve({
						kind: 'apr-us',
						advances: [{ date: '2024-01-05', amount: String(principal) }],
						payments
					});
					if (result.status !== 'solved') return false;
					// Regular first period: t = k, f = 0, so the independent sum applies.
					const root = result.roots[0];
					const atLow = directNpv(flows, root.certificate.low);
					const atHigh = directNpv(flows, root.certificate.high);
					const rate = new Wide(root.ratePerPeriod ?? '');
					const below = directNpv(flows, rate.minus(root.errorBound).toString());
					const above = directNpv(flows, rate.plus(root.errorBound).toString());
					return sign(atLow) * sign(atHigh) === -1 && sign(below) * sign(above) <= 0;
				}
			),
			{ numRuns: 40 }
		);
	});

	it('random non-conventional flows: every root is a sign change, and none on a fine grid is missed', () => {
		const grid = Array.from({ length: 800 }, (_, k) =>
			Math.expm1(Math.log(0.1) + (k * (Math.log(6) - Math.log(0.1))) / 799)
		);
		fc.assert(
			fc.property(
				fc.array(fc.integer({ min: -100, max: 100 }), { minLength: 3, maxLength: 6 }),
				(numbers) => {
					const flows = numbers.map(String);
					const result = solve({ kind: 'irr', flows });
					for (const root of result.roots) {
						const product =
							sign(directNpv(flows, root.certificate.low)) *
							sign(directNpv(flows, root.certificate.high));
						if (product !== -1) return false;
					}
					const warned = result.warnings.some(
						(w) => w.code === 'touching-root-suspected' || w.code === 'uncertified-candidate'
					);
					const values = grid.map((r) => sign(directNpv(flows, r.toPrecision(17))));
					for (let k = 1; k < grid.length; k += 1) {
						if (values[k - 1] * values[k] >= 0) continue;
						const caught = result.roots.some(
							(root) =>
								Number(root.certificate.high) >= grid[k - 1] &&
								Number(root.certificate.low) <= grid[k]
						);
						if (!caught && !warned) return false;
					}
					return true;
				}
			),
			{ numRuns: 40 }
		);
	});
});

describe('independent float64 oracles on conventional cases', () => {
	it('agrees with @formulajs/formulajs and `financial` IRR to 1e-9', () => {
		fc.assert(
			fc.property(
				fc.integer({ min: 100, max: 50_000 }),
				fc.array(fc.integer({ min: 0, max: 20_000 }), { minLength: 1, maxLength: 30 }),
				(outlay, inflows) => {
					// Plausible deals only: with inflows far below the outlay the rate sits within 1e−4 of
					// −100%, where the reference's residual stop leaves errors near 1e−8.
					if (inflows.reduce((sum, f) => sum + f, 0) < outlay / 4) return true;
					const flows = [-outlay, ...inflows];
					const ours = solve({ kind: 'irr', flows: flows.map(String) });
					if (ours.status !== 'solved') return false;
					const rate = Number(ours.rate);
					const a = formulajs.IRR(flows);
					const b = financial.irr(flows, 0.1, 1e-12, 500);
					// Compared only where an oracle converged to an admissible rate (above −100%):
					// the numpy-style solver can return a root of the polynomial below −100%.
					const agree = (other: unknown) =>
						typeof other !== 'number' ||
						!Number.isFinite(other) ||
						other <= -1 ||
						Math.abs(other - rate) <= 1e-9 * Math.max(1, Math.abs(rate));
					return agree(a) && agree(b);
				}
			),
			{ numRuns: 40 }
		);
	});

	it('agrees with @formulajs/formulajs dated IRR (act/365) to 1e-9', () => {
		fc.assert(
			fc.property(
				fc.integer({ min: 1000, max: 50_000 }),
				fc.array(fc.tuple(fc.integer({ min: 1, max: 2000 }), fc.integer({ min: 1, max: 20_000 })), {
					minLength: 1,
					maxLength: 20
				}),
				(outlay, later) => {
					const sorted = [...later].sort((p, q) => p[0] - q[0]);
					const day = (offset: number) =>
						new Date(Date.UTC(2020, 0, 1 + offset)).toISOString().slice(0, 10);
					const flows = [
						{ date: day(0), amount: String(-outlay) },
						...sorted.map(([d, a]) => ({ date: day(d), amount: String(a) }))
					];
					const ours = solve({ kind: 'dated-irr', flows });
					// A small inflow a day later puts the rate at −100% + 1e−300 or so, beyond any
					// scanned range: the engine must then say a root may lie beyond it.
					if (ours.status !== 'solved') {
						return ours.warnings.some((w) => w.code === 'more-roots-possible');
					}
					const rate = Number(ours.rate);
					if (rate > 50) return true; // beyond where a guess of 10% reliably converges
					const reference = formulajs.XIRR(
						flows.map((f) => Number(f.amount)),
						flows.map((f) => new Date(`${f.date}T00:00:00Z`))
					);
					return (
						typeof reference !== 'number' ||
						!Number.isFinite(reference) ||
						Math.abs(reference - rate) <= 1e-9 * Math.max(1, Math.abs(rate))
					);
				}
			),
			{ numRuns: 30 }
		);
	});
});
