import { Dec, TWO, bisectionCount } from './decimal';
import { refineBracket, type Bracket, type Evaluate, type Refinement } from './bisect';
import { DEFAULT_RATE_TOLERANCE, type StopRules } from './stop-rules';

/**
 * ITP — interpolate, truncate, project (I. F. D. Oliveira and R. H. C. Takahashi, "An Enhancement
 * of the Bisection Method Average Performance Preserving Minmax Optimality", ACM Transactions on
 * Mathematical Software 47(1), 2020). Parameters as the paper suggests: κ1 = 0.2 / (b0 − a0),
 * κ2 = 2, n0 = 1. It never needs more than n½ + n0 steps, n½ being bisection's count.
 */
export const ITP_SLACK = 1;
const KAPPA_2 = 2;

/** Smallest n ≥ 0 with width ≤ 2ε·2^n: the paper's n½ = ⌈log2((b0 − a0) / 2ε)⌉. */
export function halvingCount(width: Dec, tolerance: Dec): number {
	let n = 0;
	const target = tolerance.times(2);
	while (width.gt(target.times(TWO.pow(n)))) n += 1;
	return n;
}

export interface ItpRefinement extends Refinement {
	/** Bisection's count plus n0: ITP's worst-case step count for this bracket. */
	iterationBound: number;
}

export function itp(
	evaluate: Evaluate,
	start: Bracket,
	rules: StopRules,
	withTrace = false
): ItpRefinement {
	const epsilon = rules.rateTolerance ?? DEFAULT_RATE_TOLERANCE;
	const width0 = start.high.minus(start.low);
	const kappa1 = new Dec('0.2').div(width0);
	const maxSteps = halvingCount(width0, epsilon) + ITP_SLACK;
	const result = refineBracket(
		evaluate,
		start,
		rules,
		(bracket: Bracket, j: number) => {
			const { low: a, high: b } = bracket;
			const fa = bracket.atLow.value;
			const fb = bracket.atHigh.value;
			const half = a.plus(b).div(TWO);
			const radius = epsilon.times(TWO.pow(maxSteps - j)).minus(b.minus(a).div(TWO));
			const delta = kappa1.times(b.minus(a).pow(KAPPA_2));
			// Interpolate (regula falsi), truncate towards the midpoint, project into the ball.
			const falsi = a.times(fb).minus(b.times(fa)).div(fb.minus(fa));
			const sigma = half.minus(falsi).isNeg() ? -1 : 1;
			const truncated = delta.lte(half.minus(falsi).abs()) ? falsi.plus(delta.times(sigma)) : half;
			if (radius.isNeg()) return half;
			const projected = truncated.minus(half).abs().lte(radius)
				? truncated
				: half.minus(radius.times(sigma));
			return projected.gt(a) && projected.lt(b) ? projected : half;
		},
		withTrace
	);
	// The bound: bisection's count (strict form) plus n0; never below the paper's n½ + n0.
	return { ...result, iterationBound: bisectionCount(width0, epsilon) + ITP_SLACK };
}
