import { Dec } from './decimal';

/**
 * The present-value equation every kind reduces to:
 *
 *   NPV(x) = Σ amount · (1 + x)^(−ticks / ticksPerUnit) / (1 + fraction · x)
 *
 * where x is the rate being solved (per period, per unit period or effective annual). Dated
 * bases use integer ticks (days, or finer units for act/act and calendar periods) so that one
 * fractional power per evaluation suffices; Appendix J uses whole unit periods as ticks and
 * its simple-interest fraction f.
 */
export interface ScheduleTerm {
	ticks: number;
	amount: Dec;
	/** Appendix J fraction of a unit period, as an exact ratio; absent means 0. */
	fraction?: { numerator: number; denominator: number };
}

/** A stretch of equally spaced ticks with one coefficient: summed in closed form. */
export interface Run {
	firstTick: number;
	gap: number;
	count: number;
	coefficient: Dec;
}

export type Piece = { kind: 'single'; tick: number; coefficient: Dec } | ({ kind: 'run' } & Run);

/** Terms sharing one fraction f, aggregated by tick (ascending, zero sums dropped). */
export interface FractionGroup {
	fraction: Dec;
	fractionValue: number;
	pieces: Piece[];
	ticks: Float64Array;
	coefficients: Float64Array;
	magnitudes: Float64Array;
}

export interface Schedule {
	ticksPerUnit: number;
	/** How many units of the solved rate make a year: spaces the scan grid evenly per year. */
	unitsPerYear: number;
	groups: FractionGroup[];
	maxTicks: number;
	/** Amounts in time order (same-time amounts summed), for the sign-change tests. */
	timeOrdered: Dec[];
	/** True when discounting is purely compound (no simple-interest fraction). */
	compound: boolean;
	/** Largest fraction f; the equation is only defined for 1 + f·x > 0. */
	maxFraction: number;
	termCount: number;
}

const MIN_RUN = 4;

function piecesOf(ticks: number[], coefficients: Dec[]): Piece[] {
	const pieces: Piece[] = [];
	let i = 0;
	while (i < ticks.length) {
		let j = i + 1;
		if (i + 1 < ticks.length) {
			const gap = ticks[i + 1] - ticks[i];
			while (
				j < ticks.length &&
				ticks[j] - ticks[j - 1] === gap &&
				(coefficients[j] === coefficients[i] || coefficients[j].eq(coefficients[i]))
			) {
				j += 1;
			}
			if (j - i >= MIN_RUN) {
				pieces.push({
					kind: 'run',
					firstTick: ticks[i],
					gap,
					count: j - i,
					coefficient: coefficients[i]
				});
				i = j;
				continue;
			}
		}
		pieces.push({ kind: 'single', tick: ticks[i], coefficient: coefficients[i] });
		i += 1;
	}
	return pieces;
}

/** Amounts at a position (ticks, or time in unit periods). */
type Entry = { at: number; amount: Dec };

type FractionTerms = { fraction: Dec; entries: Entry[] };

function gcd(a: number, b: number): number {
	return b === 0 ? a : gcd(b, a % b);
}

/**
 * Entries in ascending position (a stable sort, skipped when they already are, as a schedule's
 * usually are), amounts at the same position summed, zero sums dropped.
 */
function summedInOrder(entries: Entry[]): Entry[] {
	let ordered = true;
	for (let i = 1; ordered && i < entries.length; i += 1) {
		ordered = entries[i - 1].at <= entries[i].at;
	}
	if (!ordered) entries.sort((x, y) => x.at - y.at);
	const summed: Entry[] = [];
	let last: Entry | undefined;
	for (const { at, amount } of entries) {
		if (last && last.at === at) last.amount = last.amount.plus(amount);
		else summed.push((last = { at, amount }));
	}
	return summed.filter((entry) => !entry.amount.isZero());
}

/** Groups terms by fraction and tick, sums same-time amounts, and finds closed-form runs. */
export function buildSchedule(
	terms: ScheduleTerm[],
	ticksPerUnit: number,
	unitsPerYear: number
): Schedule {
	const byFraction = new Map<string, FractionTerms>();
	const byTime: Entry[] = [];
	let maxFraction = 0;
	// Consecutive terms usually share their fraction: reuse the last group without a lookup.
	let last: { numerator: number; denominator: number; group: FractionTerms } | null = null;
	for (const term of terms) {
		const numerator = term.fraction?.numerator ?? 0;
		const denominator = term.fraction?.denominator ?? 1;
		let group: FractionTerms | undefined;
		if (last && last.numerator === numerator && last.denominator === denominator) {
			group = last.group;
		} else {
			const divisor = numerator === 0 ? denominator : gcd(numerator, denominator);
			const key = numerator === 0 ? '0' : `${numerator / divisor}/${denominator / divisor}`;
			group = byFraction.get(key);
			if (!group) {
				group = { fraction: new Dec(numerator).div(denominator), entries: [] };
				byFraction.set(key, group);
			}
			last = { numerator, denominator, group };
		}
		group.entries.push({ at: term.ticks, amount: term.amount });
		byTime.push({ at: term.ticks + numerator / denominator, amount: term.amount });
		maxFraction = Math.max(maxFraction, numerator / denominator);
	}
	const groups: FractionGroup[] = [];
	let maxTicks = 0;
	for (const { fraction, entries } of byFraction.values()) {
		const summed = summedInOrder(entries);
		if (summed.length === 0) continue;
		const ticks = summed.map((entry) => entry.at);
		const coefficients = summed.map((entry) => entry.amount);
		maxTicks = Math.max(maxTicks, ticks[ticks.length - 1]);
		// Runs of one amount share its Dec: convert each run once.
		const values = new Float64Array(coefficients.length);
		let previous: Dec | undefined;
		let previousValue = 0;
		coefficients.forEach((coefficient, i) => {
			if (coefficient !== previous) previousValue = (previous = coefficient).toNumber();
			values[i] = previousValue;
		});
		groups.push({
			fraction,
			fractionValue: fraction.toNumber(),
			pieces: piecesOf(ticks, coefficients),
			ticks: Float64Array.from(ticks),
			coefficients: values,
			magnitudes: values.map(Math.abs)
		});
	}
	return {
		ticksPerUnit,
		unitsPerYear,
		groups,
		maxTicks,
		timeOrdered: summedInOrder(byTime).map((entry) => entry.amount),
		compound: maxFraction === 0,
		maxFraction,
		termCount: terms.length
	};
}

/** Lowest rate x at which the equation is defined: above −100%, and 1 + f·x > 0 for every f. */
export function lowestAdmissibleRate(schedule: Schedule): number {
	return schedule.maxFraction > 1 ? -1 / schedule.maxFraction : -1;
}
