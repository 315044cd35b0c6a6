/**
 * `npm run bench`: speed of the engine against @formulajs/formulajs (float64, guess-based) measured
 * side by side in this run, and a correctness table on hard cases with known answers. A benchmark
 * reports figures; it asserts nothing.
 */
import * as formulajs from '@formulajs/formulajs';
import * as financial from 'financial';
import Decimal from 'decimal.js';
import { solve } from '../../src/lib/server/solver/index';
import type { SolveResult } from '../../src/lib/schemas/solve';
import { hardCases, oddFirstPeriodLoan, tenThousandDatedFlows, type HardCase } from './cases';
import { datedReferenceWithTimeout } from './reference';
import { formatTable, medianMs } from './timing';

const ms = (value: number) => `${value.toFixed(value < 10 ? 3 : 1)} ms`;
const asNumber = (value: unknown) =>
	typeof value === 'number' && Number.isFinite(value) ? value : null;

function speed(): void {
	const loan = oddFirstPeriodLoan();
	const loanFlows = [-252000, ...loan.payments.map((p) => Number(p.amount))];
	const apr = solve(loan);
	const aPincer = medianMs(() => solve(loan), 201, 30);
	const aReference = medianMs(() => formulajs.IRR(loanFlows), 101, 5);
	const aFinancial = medianMs(() => financial.irr(loanFlows), 101, 5);

	const dated = tenThousandDatedFlows();
	const values = dated.flows.map((f) => Number(f.amount));
	const dates = dated.flows.map((f) => new Date(`${f.date}T00:00:00Z`));
	const irr = solve(dated);
	const reference = formulajs.XIRR(values, dates) as number;
	const bPincer = medianMs(() => solve(dated), 15, 2);
	const bReference = medianMs(() => formulajs.XIRR(values, dates), 15, 2);

	console.log('Speed: medians measured side by side in this run');
	console.log(
		formatTable(
			['case', 'Pincer', 'formulajs', 'ratio Pincer/formulajs', 'financial', 'target'],
			[
				[
					'(a) APR, 360 monthly payments, odd first period, to 1e-12 with certificate',
					ms(aPincer),
					ms(aReference),
					(aPincer / aReference).toFixed(2),
					ms(aFinancial),
					'<= 3 ms'
				],
				[
					'(b) dated IRR, 10,000 flows over 10 years, to 1e-12 with certificate',
					ms(bPincer),
					ms(bReference),
					(bPincer / bReference).toFixed(2),
					'n/a (no dated IRR)',
					'<= 50 ms, faster than formulajs'
				]
			]
		)
	);
	console.log(
		`(a) Pincer: APR ${apr.rate} (disclosed ${apr.disclosed}%), unit period ${apr.unitPeriod?.label}, ` +
			`certificate per month [${apr.roots[0]?.certificate.low}, ${apr.roots[0]?.certificate.high}]. ` +
			`formulajs's equal-period IRR x 12 = ${(Number(formulajs.IRR(loanFlows)) * 12).toFixed(10)} ` +
			'(it cannot express the odd first period, so it solves a slightly different equation; timed for scale only).'
	);
	const gap = irr.rate ? Math.abs(Number(irr.rate) - reference) : NaN;
	console.log(
		`(b) Pincer: ${irr.status}, rate ${irr.rate}, scan ${irr.scan.mode} (${irr.uniqueness.holds.join(', ') || 'no uniqueness test'}); ` +
			`formulajs dated IRR ${reference}; |difference| ${gap.toExponential(2)}.`
	);
}

function pincerVerdict(result: SolveResult, expected: HardCase['expected']): [string, boolean] {
	const close = (a: string, b: string) =>
		new Decimal(a)
			.minus(b)
			.abs()
			.lte(new Decimal(1e-9).times(Decimal.max(1, new Decimal(b).abs())));
	const shown = result.roots.map((r) => r.rate).join(', ') || 'none';
	if (expected.kind === 'none')
		return [`no root (${result.reason?.code})`, result.status === 'no-root'];
	if (expected.kind === 'touching') {
		const warned = result.warnings.some((w) => w.code === 'touching-root-suspected');
		const near =
			result.reason?.closest &&
			Math.abs(Number(result.reason.closest.rate) - Number(expected.rate)) < 1e-6;
		return [
			`no sign change; touching root warned near ${result.reason?.closest?.rate}`,
			result.roots.length === 0 && warned && !!near
		];
	}
	const right =
		result.roots.length === expected.rates.length &&
		expected.rates.every((rate, i) => close(result.roots[i].rate, rate));
	return [shown, right];
}

function floatVerdict(answer: unknown, expected: HardCase['expected']): [string, boolean] {
	const value = asNumber(answer);
	const shown = value === null ? `no number (${String(answer)})` : String(value);
	if (expected.kind === 'none') return [shown, value === null];
	if (expected.kind === 'touching') return [shown, value !== null && Math.abs(value) < 1e-6];
	const right =
		value !== null &&
		expected.rates.length === 1 &&
		Math.abs(value - Number(expected.rates[0])) <=
			1e-9 * Math.max(1, Math.abs(Number(expected.rates[0])));
	return [shown, right];
}

async function correctness(): Promise<void> {
	const rows: string[][] = [];
	let pincerRight = 0;
	let formulajsRight = 0;
	let financialRight = 0;
	const cases = hardCases();
	for (const hard of cases) {
		const result = hard.flows
			? solve({ kind: 'irr', flows: hard.flows })
			: solve({ kind: 'dated-irr', flows: hard.dated ?? [] });
		const [pincerShown, pincerOk] = pincerVerdict(result, hard.expected);
		let formulajsAnswer: unknown;
		let financialAnswer: unknown = 'n/a';
		if (hard.flows) {
			const numbers = hard.flows.map(Number);
			formulajsAnswer = formulajs.IRR(numbers);
			financialAnswer = financial.irr(numbers);
		} else {
			const dated = hard.dated ?? [];
			formulajsAnswer = await datedReferenceWithTimeout(
				dated.map((f) => Number(f.amount)),
				dated.map((f) => f.date),
				3_000
			);
		}
		const [formulajsShown, formulajsOk] = floatVerdict(formulajsAnswer, hard.expected);
		const [financialShown, financialOk] = hard.flows
			? floatVerdict(financialAnswer, hard.expected)
			: ['n/a', false];
		pincerRight += pincerOk ? 1 : 0;
		formulajsRight += formulajsOk ? 1 : 0;
		financialRight += financialOk ? 1 : 0;
		const mark = (ok: boolean, shown: string) =>
			`${ok ? 'right' : 'WRONG'}: ${shown.length > 48 ? `${shown.slice(0, 45)}...` : shown}`;
		rows.push([
			hard.name,
			hard.truth,
			mark(pincerOk, pincerShown),
			mark(formulajsOk, formulajsShown),
			hard.flows ? mark(financialOk, financialShown) : 'n/a'
		]);
	}
	console.log(
		'\nCorrectness on hard cases (right = every true root reported and nothing else; "none" = no number)'
	);
	console.log(formatTable(['case', 'known answer', 'Pincer', 'formulajs', 'financial'], rows));
	const undated = cases.filter((c) => c.flows).length;
	console.log(
		`Right: Pincer ${pincerRight}/${cases.length}, formulajs ${formulajsRight}/${cases.length}, financial ${financialRight}/${undated} (undated cases only).`
	);
}

speed();
await correctness();
