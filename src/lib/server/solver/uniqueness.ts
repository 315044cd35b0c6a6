import { Dec, ZERO, toPlain } from './decimal';
import type { Schedule } from './schedule';

export type UniquenessTest = 'descartes' | 'norstrom';

export interface UniquenessReport {
	/** Sign changes of the flows in time order (Descartes' rule of signs). */
	signChanges: number;
	/** Sign changes of the cumulative flows (Norström's criterion). */
	cumulativeSignChanges: number;
	/** Sign changes of the cumulative flows summed from the last flow backwards. */
	reverseCumulativeSignChanges: number;
	finalSum: string;
	/** Tests that prove uniqueness: Descartes (one root above −100%), Norström (one above 0%). */
	holds: UniquenessTest[];
	/** Proven upper bound on the number of roots above −100%, or null when none is proven. */
	maxRoots: number | null;
	explanation: string;
}

const signOf = (value: Dec) => (value.isZero() ? 0 : value.isNeg() ? -1 : 1);

/** Sign changes in a sequence of signs (−1, 0, 1), zeros skipped. */
function changesIn(signs: readonly number[]): number {
	let changes = 0;
	let previous = 0;
	for (const sign of signs) {
		if (sign === 0) continue;
		if (previous !== 0 && sign !== previous) changes += 1;
		previous = sign;
	}
	return changes;
}

export function countSignChanges(values: readonly Dec[]): number {
	return changesIn(values.map(signOf));
}

/**
 * Root-count tests on the flows in time order. With compound discounting, NPV is a sum of
 * exponentials in s = ln(1 + r): Descartes' rule bounds its roots by the flows' sign changes; the
 * cumulative flows' sign changes bound the roots above 0% (Norström 1972, via Σ a·e^(−st) =
 * s∫A(t)e^(−st)dt); the same applied to the reversed flows bounds the roots below 0%; r = 0 is a
 * root only when the flows sum to zero. Appendix J's simple-interest fraction breaks the
 * exponential form; one sign change still gives at most one root there (dividing NPV by the
 * discount factor at the change leaves a strictly monotone sum when every fraction is ≤ 1).
 */
export function uniqueness(schedule: Schedule): UniquenessReport {
	const flows = schedule.timeOrdered;
	const signChanges = countSignChanges(flows);
	const forward: Dec[] = [];
	let running = ZERO;
	for (const flow of flows) forward.push((running = running.plus(flow)));
	const finalSum = running;
	const cumulativeSignChanges = countSignChanges(forward);
	// Summed from the last flow backwards, the sum from flow k on is finalSum − forward[k − 1]:
	// its sign is a comparison, no second pass of additions.
	const reverseCumulativeSignChanges = changesIn(
		flows.map((_, k) => (k === 0 ? signOf(finalSum) : finalSum.cmp(forward[k - 1])))
	);
	const holds: UniquenessTest[] = [];
	let maxRoots: number | null;
	const parts: string[] = [];
	if (schedule.compound) {
		const split =
			cumulativeSignChanges + reverseCumulativeSignChanges + (finalSum.isZero() ? 1 : 0);
		maxRoots = Math.min(signChanges, split);
		if (signChanges === 1) holds.push('descartes');
		if (cumulativeSignChanges === 1 && !finalSum.isZero()) holds.push('norstrom');
		parts.push(
			`Descartes: ${signChanges} sign change(s) in the flows, so at most ${signChanges} root(s) above −100%.`,
			`Norström: ${cumulativeSignChanges} sign change(s) in the cumulative flows (final sum ${toPlain(finalSum)}), so at most ${cumulativeSignChanges} root(s) above 0%` +
				`; reversed: at most ${reverseCumulativeSignChanges} below 0%.`
		);
	} else {
		const fractionsWithinUnit = schedule.maxFraction <= 1;
		maxRoots = signChanges === 1 && fractionsWithinUnit ? 1 : null;
		if (maxRoots === 1) holds.push('descartes');
		parts.push(
			`${signChanges} sign change(s) in time order. With Appendix J's simple-interest fraction only a single sign change proves a unique root` +
				(fractionsWithinUnit ? '.' : ' (and only while every fraction is at most one unit period).')
		);
	}
	if (signChanges === 0) maxRoots = 0;
	parts.push(
		maxRoots === null
			? 'No bound is proven; the scan is the evidence.'
			: `Proven: at most ${maxRoots} root(s) above −100%.`
	);
	return {
		signChanges,
		cumulativeSignChanges,
		reverseCumulativeSignChanges,
		finalSum: toPlain(finalSum),
		holds,
		maxRoots,
		explanation: parts.join(' ')
	};
}
