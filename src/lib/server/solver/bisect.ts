import { Dec, TWO, bisectionCount } from './decimal';
import type { DecimalValue } from './npv';
import { rulesMet, type StopReason, type StopRules } from './stop-rules';

export interface TraceStep {
	iteration: number;
	low: Dec;
	high: Dec;
	point: Dec;
	value: Dec;
}

/** A certified bracket: NPV at the two ends has opposite signs beyond rounding. */
export interface Bracket {
	low: Dec;
	high: Dec;
	atLow: DecimalValue;
	atHigh: DecimalValue;
}

export interface Refinement extends Bracket {
	/** Reported root: the midpoint, or the last evaluated point when the residual rule stopped. */
	point: Dec;
	/** Proven bound on |point − root|. */
	errorBound: Dec;
	iterations: number;
	/** Bisection's count for this bracket (null when no rate tolerance applies). */
	predictedIterations: number | null;
	stoppedBy: StopReason;
	trace: TraceStep[];
}

export type Evaluate = (x: Dec) => DecimalValue;

/** The next point to evaluate, given the current bracket and step number. */
export type NextPoint = (bracket: Bracket, iteration: number) => Dec;

/**
 * Shared bracketed loop for bisection and ITP: evaluate the next point, keep the half whose ends
 * still differ in sign, stop by the rules. A point whose |NPV| is within rounding cannot be
 * signed; the loop then stops with the bracket it has (still a valid certificate).
 */
export function refineBracket(
	evaluate: Evaluate,
	start: Bracket,
	rules: StopRules,
	nextPoint: NextPoint,
	withTrace: boolean
): Refinement {
	const bracket: Bracket = { ...start };
	const trace: TraceStep[] = [];
	const lowSign = bracket.atLow.value.isNeg();
	let iterations = 0;
	let lastPoint: Dec | null = null;
	let lastResidual: Dec | null = null;
	let useLastPoint = false;
	let stoppedBy: StopReason = 'iteration-cap';
	for (;;) {
		const check = rulesMet(rules, bracket.high.minus(bracket.low), lastResidual);
		if (check.met) {
			stoppedBy =
				check.byRate && check.byResidual
					? 'rate-and-residual'
					: check.byRate
						? 'rate-tolerance'
						: 'residual-tolerance';
			useLastPoint = check.byResidual && (rules.combine === 'all' || !check.byRate);
			break;
		}
		if (iterations >= rules.maxIterations) break;
		const point = nextPoint(bracket, iterations);
		if (!point.gt(bracket.low) || !point.lt(bracket.high)) {
			stoppedBy = 'precision-limit';
			break;
		}
		const at = evaluate(point);
		iterations += 1;
		if (withTrace) {
			trace.push({
				iteration: iterations,
				low: bracket.low,
				high: bracket.high,
				point,
				value: at.value
			});
		}
		lastPoint = point;
		if (at.value.isZero() || at.value.abs().lte(at.bound)) {
			stoppedBy = at.value.isZero() ? 'exact-zero' : 'precision-limit';
			useLastPoint = true;
			break;
		}
		if (at.value.isNeg() === lowSign) {
			bracket.low = point;
			bracket.atLow = at;
		} else {
			bracket.high = point;
			bracket.atHigh = at;
		}
		lastResidual = at.value.abs();
	}
	const width = bracket.high.minus(bracket.low);
	const point =
		useLastPoint && lastPoint !== null ? lastPoint : bracket.low.plus(bracket.high).div(TWO);
	return {
		...bracket,
		point,
		errorBound: useLastPoint ? width : width.div(TWO),
		iterations,
		predictedIterations:
			rules.rateTolerance === null
				? null
				: bisectionCount(start.high.minus(start.low), rules.rateTolerance),
		stoppedBy,
		trace
	};
}

/** Bisection on a certified bracket: each step halves the width, so the bound is known ahead. */
export function bisect(
	evaluate: Evaluate,
	start: Bracket,
	rules: StopRules,
	withTrace = false
): Refinement {
	return refineBracket(evaluate, start, rules, (b) => b.low.plus(b.high).div(TWO), withTrace);
}

/** Error bound after n bisection steps from width w: w / 2^(n+1). */
export function bisectionBound(width: Dec, steps: number): Dec {
	return width.div(TWO.pow(steps + 1));
}
