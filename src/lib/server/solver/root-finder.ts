import { Dec, ONE, TWO } from './decimal';
import { bisect, type Bracket, type Evaluate, type Refinement } from './bisect';
import { certifySeed, opposite } from './certify';
import { itp } from './itp';
import { evaluateDecimal } from './npv';
import {
	extendedRange,
	narrow,
	scan,
	standardRange,
	type Cell,
	type ScanResult,
	type TouchCandidate
} from './scan';
import { lowestAdmissibleRate, type Schedule } from './schedule';
import { DEFAULT_RATE_TOLERANCE, type StopRules } from './stop-rules';
import { uniqueness, type UniquenessReport } from './uniqueness';

export type Method = 'bisection' | 'itp';

export interface Warning {
	code: string;
	message: string;
}

export interface FoundRoot extends Refinement {
	/** True when a float64 scan narrowed the bracket before decimal certification. */
	seeded: boolean;
	/** Decimal evaluations spent certifying the seed (0 for an explicit bracket). */
	certifyEvaluations: number;
	/** Float64 bisection steps spent narrowing the seed. */
	seedIterations: number;
	/** ITP only: bisection's count plus n0, which ITP never exceeds. */
	iterationBound?: number;
}

export type NoRootCode = 'all-zero' | 'one-sign' | 'no-sign-change' | 'bracket-same-sign';

export interface RootSearch {
	roots: FoundRoot[];
	warnings: Warning[];
	uniqueness: UniquenessReport;
	noRoot?: { code: NoRootCode; closest?: { rate: Dec; npv: Dec } };
	scan: { mode: 'light' | 'fine' | 'none'; points: number };
}

export interface SearchOptions {
	method: Method;
	bracket?: { low: Dec; high: Dec };
	rules: StopRules;
	trace: boolean;
	/** Formats a rate of the solved variable for messages, with its unit. */
	describe: (x: Dec) => string;
}

interface Context {
	schedule: Schedule;
	options: SearchOptions;
	evaluate: Evaluate;
	lowest: Dec;
	tolerance: Dec;
	roots: FoundRoot[];
	warnings: Warning[];
}

/**
 * A decimal rate x with 1 + x = e^y to float64 accuracy. Near −100% float64 would lose 1 + x in
 * x itself, so there 1 + x is computed first (Math.exp keeps full relative precision down to
 * e^−700) and 1 is subtracted in decimal; below that, decimal's own exp. Any such point serves:
 * every sign is decided by evaluating the equation there in decimal.
 */
function rateAt(y: number): Dec {
	if (y >= -0.5) return new Dec(Math.expm1(y));
	return y > -700 ? new Dec(Math.exp(y)).minus(ONE) : new Dec(y).exp().minus(ONE);
}

function refine(ctx: Context, start: Bracket): Refinement & { iterationBound?: number } {
	const { method, rules, trace } = ctx.options;
	return method === 'itp'
		? itp(ctx.evaluate, start, rules, trace)
		: bisect(ctx.evaluate, start, rules, trace);
}

/** Float64 narrowing, decimal certificate, decimal refinement of one scan cell. */
function seedCell(ctx: Context, cell: Cell): void {
	const seed = narrow(ctx.schedule, cell);
	const limits = { low: rateAt(cell.yLow), high: rateAt(cell.yHigh) };
	const certificate = certifySeed(ctx.evaluate, rateAt(seed.y), limits, ctx.tolerance, ctx.lowest);
	if (!certificate.bracket) {
		ctx.warnings.push({
			code: 'uncertified-candidate',
			message: `The float64 scan saw a sign change near ${ctx.options.describe(rateAt(seed.y))}, but decimal evaluation could not confirm opposite signs there (NPV is within rounding of zero); no root is reported for it.`
		});
		return;
	}
	const refined = refine(ctx, certificate.bracket);
	if (ctx.options.trace) {
		// Step 0: the certified seed bracket, with NPV at its midpoint, so the trace is never empty.
		const { low, high } = certificate.bracket;
		const point = low.plus(high).div(TWO);
		refined.trace.unshift({ iteration: 0, low, high, point, value: ctx.evaluate(point).value });
	}
	ctx.roots.push({
		...refined,
		seeded: true,
		certifyEvaluations: certificate.evaluations,
		seedIterations: seed.iterations
	});
}

/**
 * A near-zero minimum of |NPV| without a sign change on the grid: if decimal finds the opposite
 * sign at the minimum, two roots sit inside one grid cell and both are refined; otherwise warn.
 */
function reviewTouch(ctx: Context, touch: TouchCandidate): void {
	const x = rateAt(touch.y);
	const at = ctx.evaluate(x);
	const cellLow = rateAt(touch.cell.yLow);
	const atCellLow = ctx.evaluate(cellLow);
	if (opposite(atCellLow, at)) {
		seedCell(ctx, { yLow: touch.cell.yLow, yHigh: touch.y });
		seedCell(ctx, { yLow: touch.y, yHigh: touch.cell.yHigh });
		return;
	}
	const describe = ctx.options.describe;
	const exact = at.value.abs().lte(at.bound);
	ctx.warnings.push({
		code: 'touching-root-suspected',
		message: exact
			? `NPV is zero at ${describe(x)} (within rounding) but does not change sign there: a double (touching) root. It has no sign-change certificate, so it is not listed among the roots.`
			: `|NPV| dips to ${at.value.abs().toSignificantDigits(6)} (${touch.relative > 0 ? `${touch.relative.toExponential(2)} of the gross present value` : 'zero at float64 resolution'}) at ${describe(x)} without changing sign: a touching root, or two roots closer together than the scan grid, may lie there.`
	});
}

function stopWarnings(ctx: Context): void {
	const { describe, rules } = ctx.options;
	for (const root of ctx.roots) {
		const where = `near ${describe(root.point)}; the certificate [${root.low}, ${root.high}] still holds the root`;
		if (root.stoppedBy === 'iteration-cap') {
			ctx.warnings.push({
				code: 'iteration-cap',
				message: `The iteration cap stopped refinement before the stop rules were met, ${where}.`
			});
		}
		const unmet =
			rules.rateTolerance !== null && root.high.minus(root.low).gt(rules.rateTolerance.times(TWO));
		if (root.stoppedBy === 'precision-limit' && unmet) {
			ctx.warnings.push({
				code: 'precision-limit',
				message: `Decimal precision ran out before the rate tolerance was met, ${where}.`
			});
		}
	}
}

function finish(
	ctx: Context,
	report: UniquenessReport,
	result: ScanResult,
	mode: 'light' | 'fine',
	explicitBracket: boolean
): RootSearch {
	for (const touch of result.touches) reviewTouch(ctx, touch);
	ctx.roots.sort((p, q) => p.point.comparedTo(q.point));
	// Certificates that overlap may hold the same root (a cell edge can fall beside an explicit
	// bracket's root): keep one, preferring the exact bracket's run.
	ctx.roots = ctx.roots.filter((root, i, all) => {
		const next = all[i + 1];
		const previous = all[i - 1];
		const overlapsNext =
			next !== undefined && next.low.lte(root.high) && !next.seeded && root.seeded;
		const overlapsPrevious =
			previous !== undefined && root.low.lte(previous.high) && (root.seeded || !previous.seeded);
		return !overlapsNext && !overlapsPrevious;
	});
	stopWarnings(ctx);
	const allowed = report.maxRoots ?? report.signChanges;
	if (ctx.roots.length < allowed) {
		ctx.warnings.push({
			code: 'more-roots-possible',
			message: explicitBracket
				? `The sign-change tests allow up to ${allowed} root(s) above −100%; ${ctx.roots.length} lie in the given bracket. Others may lie outside it: solve without a bracket to scan the whole range.`
				: `The sign-change tests allow up to ${allowed} root(s) above −100%; the scan found ${ctx.roots.length}. The others may be complex, a pair closer together than the scan grid, or beyond the scanned range.`
		});
	}
	const search: RootSearch = {
		roots: ctx.roots,
		warnings: ctx.warnings,
		uniqueness: report,
		scan: { mode, points: result.points }
	};
	if (ctx.roots.length === 0) {
		const rate = rateAt(result.closestY);
		search.noRoot = {
			code: explicitBracket ? 'bracket-same-sign' : 'no-sign-change',
			closest: { rate, npv: ctx.evaluate(rate).value }
		};
	}
	return search;
}

/** Scans, certifies in decimal and refines every sign change of the schedule's NPV. */
export function findRoots(schedule: Schedule, options: SearchOptions): RootSearch {
	const report = uniqueness(schedule);
	const none = { mode: 'none' as const, points: 0 };
	if (schedule.groups.length === 0) {
		return {
			roots: [],
			warnings: [],
			uniqueness: report,
			noRoot: { code: 'all-zero' },
			scan: none
		};
	}
	if (report.signChanges === 0) {
		return {
			roots: [],
			warnings: [],
			uniqueness: report,
			noRoot: { code: 'one-sign' },
			scan: none
		};
	}
	const ctx: Context = {
		schedule,
		options,
		evaluate: (x) => evaluateDecimal(schedule, x),
		lowest: new Dec(lowestAdmissibleRate(schedule)),
		tolerance: options.rules.rateTolerance ?? DEFAULT_RATE_TOLERANCE,
		roots: [],
		warnings: []
	};
	if (!options.bracket) {
		const fine = report.maxRoots === null || report.maxRoots > 1;
		const result = scan(schedule, fine ? standardRange(schedule) : extendedRange(schedule), fine);
		for (const cell of result.cells) seedCell(ctx, cell);
		return finish(ctx, report, result, fine ? 'fine' : 'light', false);
	}
	let { low } = options.bracket;
	const { high } = options.bracket;
	if (!low.gt(ctx.lowest)) {
		low = ctx.lowest.plus(high).div(TWO);
		ctx.warnings.push({
			code: 'bracket-clamped',
			message: `The bracket's low end is below where the equation is defined; it was raised to ${options.describe(low)}.`
		});
	}
	const atLow = ctx.evaluate(low);
	const atHigh = ctx.evaluate(high);
	const range = { yLow: ONE.plus(low).ln().toNumber(), yHigh: ONE.plus(high).ln().toNumber() };
	const inside = scan(schedule, range, true);
	if (opposite(atLow, atHigh)) {
		// Exactly the given bracket, the textbook way; the scan inside only adds further roots.
		const textbook = refine(ctx, { low, high, atLow, atHigh });
		ctx.roots.push({ ...textbook, seeded: false, certifyEvaluations: 0, seedIterations: 0 });
		for (const cell of inside.cells) {
			const holdsTextbookRoot =
				textbook.point.gte(rateAt(cell.yLow)) && textbook.point.lte(rateAt(cell.yHigh));
			if (!holdsTextbookRoot) seedCell(ctx, cell);
		}
		return finish(ctx, report, inside, 'fine', true);
	}
	const describe = options.describe;
	ctx.warnings.push({
		code: 'bracket-same-sign',
		message: `NPV does not change sign between the bracket's ends (${describe(low)}: ${atLow.value.toSignificantDigits(6)}; ${describe(high)}: ${atHigh.value.toSignificantDigits(6)}), so bisection cannot start on it; the engine scanned inside the bracket instead.`
	});
	for (const cell of inside.cells) seedCell(ctx, cell);
	return finish(ctx, report, inside, 'fine', true);
}
