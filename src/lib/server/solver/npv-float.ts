import type { FractionGroup, Schedule } from './schedule';

/**
 * Float64 evaluation of the schedule's NPV, used only to find and narrow candidate brackets.
 * The variable is y = ln(1 + x) per unit, so x > −1 holds by construction. For y ≥ 0 the sum is
 * taken in present-value form (discount factors ≤ 1); for y < 0 in future-value form, scaled by
 * (1 + x)^(maxTicks/ticksPerUnit), so negative rates cannot overflow. The scale is positive and
 * reported as a logarithm, so signs and the ratio |value| / gross are exact in meaning.
 */
export interface FloatValue {
	value: number;
	/** Σ |terms| with the same scaling: |value| / gross is a scale-free residual. */
	gross: number;
	/** ln of the factor that turns value and gross into true present values. */
	logScale: number;
}

interface GapIndex {
	distinct: Float64Array;
	index: Int32Array;
}

const gapCache = new WeakMap<FractionGroup, GapIndex>();

function gapIndex(group: FractionGroup): GapIndex {
	let cached = gapCache.get(group);
	if (cached) return cached;
	const positions = new Map<number, number>();
	const index = new Int32Array(Math.max(0, group.ticks.length - 1));
	for (let k = 1; k < group.ticks.length; k += 1) {
		const gap = group.ticks[k] - group.ticks[k - 1];
		let position = positions.get(gap);
		if (position === undefined) {
			position = positions.size;
			positions.set(gap, position);
		}
		index[k - 1] = position;
	}
	cached = { distinct: Float64Array.from(positions.keys()), index };
	gapCache.set(group, cached);
	return cached;
}

export function evaluateFloat(schedule: Schedule, y: number): FloatValue {
	const perTick = y / schedule.ticksPerUnit;
	const x = Math.expm1(y);
	const presentForm = y >= 0;
	let value = 0;
	let gross = 0;
	for (const group of schedule.groups) {
		const { distinct, index } = gapIndex(group);
		const powers = new Float64Array(distinct.length);
		for (let g = 0; g < distinct.length; g += 1) {
			powers[g] = Math.exp((presentForm ? -perTick : perTick) * distinct[g]);
		}
		const { ticks, coefficients: c, magnitudes: m } = group;
		const n = ticks.length;
		let sum: number;
		let abs: number;
		if (presentForm) {
			sum = c[n - 1];
			abs = m[n - 1];
			for (let k = n - 2; k >= 0; k -= 1) {
				const p = powers[index[k]];
				sum = sum * p + c[k];
				abs = abs * p + m[k];
			}
			const lead = Math.exp(-perTick * ticks[0]);
			sum *= lead;
			abs *= lead;
		} else {
			sum = c[0];
			abs = m[0];
			for (let k = 1; k < n; k += 1) {
				const p = powers[index[k - 1]];
				sum = sum * p + c[k];
				abs = abs * p + m[k];
			}
			const tail = Math.exp(perTick * (schedule.maxTicks - ticks[n - 1]));
			sum *= tail;
			abs *= tail;
		}
		if (group.fractionValue !== 0) {
			const simple = 1 + group.fractionValue * x;
			sum /= simple;
			abs /= simple;
		}
		value += sum;
		gross += abs;
	}
	return { value, gross, logScale: presentForm ? 0 : -perTick * schedule.maxTicks };
}

/** Natural log of |NPV| (true present value), for comparing magnitudes across the range. */
export function logAbsoluteNpv(result: FloatValue): number {
	return Math.log(Math.abs(result.value)) + result.logScale;
}
