import { Dec } from './decimal';

export type Combine = 'any' | 'all';

/** When a refinement stops. Tolerances are in the solved rate's own unit (per period or per year). */
export interface StopRules {
	/** Stop when the bracket is at most 2·rateTolerance wide (midpoint within rateTolerance). */
	rateTolerance: Dec | null;
	/** Stop when |NPV| at the latest point is at most residualTolerance. */
	residualTolerance: Dec | null;
	maxIterations: number;
	combine: Combine;
}

export const DEFAULT_RATE_TOLERANCE = new Dec('1e-12');
export const DEFAULT_MAX_ITERATIONS = 200;

export interface StopRequest {
	rateTolerance?: string;
	residualTolerance?: string;
	maxIterations?: number;
	combine?: Combine;
}

/**
 * The user's stop rules with defaults: rate tolerance 1e-12 unless only a residual tolerance was
 * given (a residual rule alone is allowed, and warned about), cap 200, combine "any".
 */
export function resolveStopRules(stop: StopRequest | undefined): StopRules {
	const residualTolerance =
		stop?.residualTolerance !== undefined ? new Dec(stop.residualTolerance) : null;
	const rateTolerance =
		stop?.rateTolerance !== undefined
			? new Dec(stop.rateTolerance)
			: residualTolerance === null
				? DEFAULT_RATE_TOLERANCE
				: null;
	return {
		rateTolerance,
		residualTolerance,
		maxIterations: stop?.maxIterations ?? DEFAULT_MAX_ITERATIONS,
		combine: stop?.combine ?? 'any'
	};
}

export type StopReason =
	| 'rate-tolerance'
	| 'residual-tolerance'
	| 'rate-and-residual'
	| 'exact-zero'
	| 'precision-limit'
	| 'iteration-cap'
	| 'no-bracket';

/** Whether the chosen convergence rules are met, given the bracket width and latest residual. */
export function rulesMet(
	rules: StopRules,
	width: Dec,
	residual: Dec | null
): { met: boolean; byRate: boolean; byResidual: boolean } {
	const byRate = rules.rateTolerance !== null && width.lte(rules.rateTolerance.times(2));
	const byResidual =
		rules.residualTolerance !== null && residual !== null && residual.lte(rules.residualTolerance);
	const wanted = [rules.rateTolerance !== null, rules.residualTolerance !== null];
	const got = [byRate, byResidual];
	const met =
		rules.combine === 'all'
			? wanted.every((w, i) => !w || got[i])
			: wanted.some((w, i) => w && got[i]);
	return { met, byRate, byResidual };
}
