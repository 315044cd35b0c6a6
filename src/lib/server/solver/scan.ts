import { evaluateFloat, logAbsoluteNpv } from './npv-float';
import { lowestAdmissibleRate, type Schedule } from './schedule';

/**
 * The float64 scan: it only proposes candidate brackets; decimal evaluation decides. The grid
 * is laid in Y = ln(1 + x) × unitsPerYear (log growth per year), so x > −1 by construction and
 * one spacing serves monthly, daily and annual rates alike. Fine grid: steps of 0.002 in Y for
 * annual rates between −90% and +1000% (roots a few tenths of a point apart separate), steps of
 * 1% of |Y| beyond. Light grid (a unique root is proven): 0.05 and 10%.
 */
export interface ScanRange {
	yLow: number;
	yHigh: number;
}

export interface Cell {
	yLow: number;
	yHigh: number;
}

export interface TouchCandidate {
	y: number;
	/** |NPV| / Σ|terms| at the minimum: scale-free. */
	relative: number;
	/** Grid cell around the minimum, for splitting if decimal finds a sign change there. */
	cell: Cell;
}

export interface ScanResult {
	cells: Cell[];
	touches: TouchCandidate[];
	/** Grid point (refined) where |NPV| is smallest. */
	closestY: number;
	points: number;
}

/** Standard range: rates from −100% + 1e−12 to 1,000,000% per unit. */
export function standardRange(schedule: Schedule): ScanRange {
	return rangeFor(schedule, 1e-12, 1e4);
}

/** Extended range, used when at most one root is proven: −100% + 1e−30 to 1e30 per unit. */
export function extendedRange(schedule: Schedule): ScanRange {
	return rangeFor(schedule, 1e-30, 1e30);
}

function rangeFor(schedule: Schedule, nearMinusOne: number, highest: number): ScanRange {
	const lowest = lowestAdmissibleRate(schedule);
	const yLow = lowest > -1 ? Math.log1p(lowest) + 1e-6 : Math.log(nearMinusOne);
	return { yLow, yHigh: Math.log1p(highest) };
}

const CORE_LOW = Math.log(0.1);
const CORE_HIGH = Math.log(11);

export function gridPoints(range: ScanRange, unitsPerYear: number, fine: boolean): number[] {
	const step = fine ? 0.002 : 0.05;
	const ratio = fine ? 0.01 : 0.1;
	const low = range.yLow * unitsPerYear;
	const high = range.yHigh * unitsPerYear;
	const coreLow = Math.min(Math.max(CORE_LOW, low), high);
	const coreHigh = Math.max(Math.min(CORE_HIGH, high), low);
	const below: number[] = [];
	for (let Y = coreLow; Y > low; Y -= Math.max(step, ratio * Math.abs(Y))) below.push(Y);
	below.push(low);
	below.reverse();
	const core: number[] = [];
	const count = Math.ceil((coreHigh - coreLow) / step);
	for (let k = 1; k < count; k += 1) core.push(coreLow + (k * (coreHigh - coreLow)) / count);
	const above: number[] = [];
	for (let Y = coreHigh; Y < high; Y += Math.max(step, ratio * Math.abs(Y))) above.push(Y);
	above.push(high);
	const all = [...below, ...core, ...above];
	const unique = all.filter((Y, i) => i === 0 || Y > all[i - 1]);
	return unique.map((Y) => Y / unitsPerYear);
}

const TOUCH_SCREEN = 1e-3;
const TOUCH_LIMIT = 1e-6;
const MAX_TOUCH_CANDIDATES = 8;

/** Golden-section search for a minimum of `f` on [a, b]. */
export function goldenMinimum(f: (y: number) => number, a: number, b: number): number {
	const g = (Math.sqrt(5) - 1) / 2;
	let c = b - g * (b - a);
	let d = a + g * (b - a);
	let fc = f(c);
	let fd = f(d);
	for (let k = 0; k < 80 && b - a > 1e-15 * (1 + Math.abs(a)); k += 1) {
		if (fc <= fd) {
			b = d;
			d = c;
			fd = fc;
			c = b - g * (b - a);
			fc = f(c);
		} else {
			a = c;
			c = d;
			fc = fd;
			d = a + g * (b - a);
			fd = f(d);
		}
	}
	return fc <= fd ? c : d;
}

/**
 * Evaluates the grid and reports sign-change cells, near-touching minima (fine grid only) and the
 * point of smallest |NPV|. With at most one root proven (light mode), opposite signs at the range
 * ends already locate it, and the grid is skipped.
 */
export function scan(schedule: Schedule, range: ScanRange, fine: boolean): ScanResult {
	if (!fine) {
		const low = Math.sign(evaluateFloat(schedule, range.yLow).value);
		const high = Math.sign(evaluateFloat(schedule, range.yHigh).value);
		if (low * high < 0) {
			return {
				cells: [{ yLow: range.yLow, yHigh: range.yHigh }],
				touches: [],
				closestY: 0,
				points: 2
			};
		}
	}
	const ys = gridPoints(range, schedule.unitsPerYear, fine);
	const signs = new Int8Array(ys.length);
	const relative = new Float64Array(ys.length);
	let closest = 0;
	let closestLog = Infinity;
	ys.forEach((y, i) => {
		const at = evaluateFloat(schedule, y);
		signs[i] = Math.sign(at.value);
		relative[i] = at.gross > 0 ? Math.abs(at.value) / at.gross : 0;
		const logAbs = logAbsoluteNpv(at);
		if (logAbs < closestLog) {
			closestLog = logAbs;
			closest = i;
		}
	});
	const cells: Cell[] = [];
	const touches: TouchCandidate[] = [];
	let previous = -1;
	for (let i = 0; i < ys.length; i += 1) {
		if (signs[i] === 0) continue;
		if (previous >= 0) {
			if (signs[previous] !== signs[i]) cells.push({ yLow: ys[previous], yHigh: ys[i] });
			else if (i - previous > 1) {
				touches.push({
					y: ys[previous + 1],
					relative: 0,
					cell: { yLow: ys[previous], yHigh: ys[i] }
				});
			}
		}
		previous = i;
	}
	if (fine) touches.push(...nearTouches(schedule, ys, signs, relative));
	const around = (i: number) => [ys[Math.max(0, i - 1)], ys[Math.min(ys.length - 1, i + 1)]];
	const [a, b] = around(closest);
	const closestY =
		a < b ? goldenMinimum((y) => logAbsoluteNpv(evaluateFloat(schedule, y)), a, b) : ys[closest];
	return { cells, touches, closestY, points: ys.length };
}

/** Local minima of |NPV|/Σ|terms| close to zero with no sign change around them. */
function nearTouches(
	schedule: Schedule,
	ys: number[],
	signs: Int8Array,
	relative: Float64Array
): TouchCandidate[] {
	const minima: number[] = [];
	for (let i = 1; i < ys.length - 1; i += 1) {
		const steady = signs[i - 1] === signs[i] && signs[i] === signs[i + 1] && signs[i] !== 0;
		if (steady && relative[i] <= relative[i - 1] && relative[i] <= relative[i + 1]) {
			if (relative[i] < TOUCH_SCREEN) minima.push(i);
		}
	}
	minima.sort((p, q) => relative[p] - relative[q]);
	const found: TouchCandidate[] = [];
	for (const i of minima.slice(0, MAX_TOUCH_CANDIDATES)) {
		const ratio = (y: number) => {
			const at = evaluateFloat(schedule, y);
			return Math.abs(at.value) / at.gross;
		};
		const y = goldenMinimum(ratio, ys[i - 1], ys[i + 1]);
		const value = ratio(y);
		if (value < TOUCH_LIMIT) {
			found.push({ y, relative: value, cell: { yLow: ys[i - 1], yHigh: ys[i + 1] } });
		}
	}
	return found;
}

/** Float64 bisection on y inside a sign-change cell, down to the last representable split. */
export function narrow(schedule: Schedule, cell: Cell): { y: number; iterations: number } {
	let { yLow, yHigh } = cell;
	const lowSign = Math.sign(evaluateFloat(schedule, yLow).value);
	let iterations = 0;
	while (iterations < 200) {
		const mid = (yLow + yHigh) / 2;
		if (mid <= yLow || mid >= yHigh) break;
		const sign = Math.sign(evaluateFloat(schedule, mid).value);
		iterations += 1;
		if (sign === 0) return { y: mid, iterations };
		if (sign === lowSign) yLow = mid;
		else yHigh = mid;
	}
	return { y: (yLow + yHigh) / 2, iterations };
}
