// The loan file as a workbook for review: Terms, Schedule (with formulas that recompute each
// flow's present value from the solved rate), Disclosure and Trace.
import ExcelJS from 'exceljs';
import type { SolveResult } from '../../schemas/solve';
import { countUnitPeriods } from '../solver/appendix-j';
import { ACT_ACT_TICKS_PER_YEAR, actActTicks, parseDate } from '../solver/day-count';
import { scheduledDay, unitPeriodOf } from '../solver/unit-period';
import type { TraceRun } from '../solves/trace';
import { CAUTION } from './disclosure';
import { headerOf, type LoanFile } from './file';
import type { LoanFigures } from './schedule';

type Flow = {
	kind: 'advance' | 'payment';
	date: string;
	amount: string;
	t: number;
	f: number;
	fText: string;
};

/** Each flow's time from the first advance: Appendix J t and f (US) or years on the actual-day basis (EU). */
export function flowTimes(file: LoanFile, figures: LoanFigures): Flow[] {
	const advances = figures.advances.map((a) => ({ kind: 'advance' as const, ...a }));
	const payments = figures.payments.map((p) => ({
		kind: 'payment' as const,
		date: p.date,
		amount: p.amount
	}));
	const start = parseDate(advances[0].date);
	if (headerOf(file).regime === 'eu-aprc') {
		return [...advances, ...payments].map((flow) => {
			const ticks = actActTicks(start, parseDate(flow.date));
			return {
				...flow,
				t: 0,
				f: ticks / ACT_ACT_TICKS_PER_YEAR,
				fText: `${ticks}/${ACT_ACT_TICKS_PER_YEAR}`
			};
		});
	}
	const unit = unitPeriodOf(
		advances.map((a) => parseDate(a.date)),
		payments.map((p) => parseDate(p.date))
	);
	const count = (list: { date: string }[]) => {
		const dates = list.map((x) => parseDate(x.date));
		const day = scheduledDay(dates);
		return dates.map((date) => countUnitPeriods(start, date, unit, day));
	};
	const ac = count(advances);
	const pc = count(payments);
	return [
		...advances.map((a, k) => ({
			...a,
			t: ac[k].t,
			f: ac[k].numerator / ac[k].denominator,
			fText: `${ac[k].numerator}/${ac[k].denominator}`
		})),
		...payments.map((p, k) => ({
			...p,
			t: pc[k].t,
			f: pc[k].numerator / pc[k].denominator,
			fText: `${pc[k].numerator}/${pc[k].denominator}`
		}))
	];
}

export async function loanWorkbook(input: {
	file: LoanFile;
	figures: LoanFigures;
	result: SolveResult;
	version: number;
	engineVersion: string;
	trace: TraceRun[] | null;
}): Promise<Uint8Array> {
	const { file, figures, result } = input;
	const header = headerOf(file);
	const eu = header.regime === 'eu-aprc';
	const book = new ExcelJS.Workbook();
	book.creator = 'Pincer';
	book.title = `Loan ${header.reference}`;
	const bold = { bold: true };

	const terms = book.addWorksheet('Terms');
	terms.columns = [{ width: 34 }, { width: 40 }];
	const termRows: [string, string | number][] = [
		['Reference', header.reference],
		['Borrower', header.borrowerName],
		['Regime', eu ? 'EU APRC (Directive 2008/48/EC Annex I)' : 'US APR (12 CFR 1026 Appendix J)'],
		['Version', input.version],
		['Entry', file.entryMode === 'terms' ? 'terms' : 'schedule entry']
	];
	if (file.entryMode === 'terms') {
		const t = file.terms;
		termRows.push(
			['Amount of credit', t.amountOfCredit],
			['Note rate (% per year)', t.noteRate],
			['Number of payments', t.numberOfPayments],
			['Frequency', t.frequency],
			['Date of the advance', t.advanceDate],
			['First payment date', t.firstPaymentDate],
			['Balloon', t.balloon || 'none'],
			['Payment rounding', t.rounding]
		);
		t.feeAmount.forEach(
			(amount, i) =>
				amount && termRows.push([`Fee: ${t.feeName[i] || i + 1}`, `${amount} (${t.feeKind[i]})`])
		);
	}
	termRows.push(['Engine', input.engineVersion], ['Caution', CAUTION]);
	for (const row of termRows) terms.addRow(row);
	terms.getColumn(1).font = bold;

	const schedule = book.addWorksheet('Schedule', { views: [{ state: 'frozen', ySplit: 4 }] });
	const rate =
		result.roots.length === 1 ? Number(result.roots[0].ratePerPeriod ?? result.roots[0].rate) : 0;
	schedule.getCell('A1').value = eu
		? 'Solved APRC (effective annual)'
		: 'Solved rate per unit period';
	schedule.getCell('A1').font = bold;
	schedule.getCell('B1').value = rate;
	schedule.getCell('B1').numFmt = '0.000000000000000';
	schedule.getCell('C1').value =
		`exact: ${result.roots[0]?.ratePerPeriod ?? result.roots[0]?.rate ?? 'no rate'}`;
	book.definedNames.add(`'Schedule'!$B$1`, 'solved_rate');
	schedule.getCell('A2').value = eu
		? 'Discount factor = (1 + rate) ^ -(years from the first drawdown)'
		: 'Discount factor = 1 / ((1 + f × rate) × (1 + rate) ^ t), Appendix J (b)(8)';
	schedule.getRow(4).values = [
		'#',
		'kind',
		'date',
		'amount',
		eu ? 'years' : 't',
		eu ? 'years (exact)' : 'f',
		'discount factor',
		'present value'
	];
	schedule.getRow(4).font = bold;
	schedule.columns = [8, 10, 12, 14, 8, 16, 18, 16].map((width) => ({ width }));
	const flows = flowTimes(file, figures);
	let r = 5;
	for (const [k, flow] of flows.entries()) {
		const amount = Number(flow.amount) * (flow.kind === 'advance' ? -1 : 1);
		const df = eu
			? Math.pow(1 + rate, -flow.f)
			: 1 / ((1 + flow.f * rate) * Math.pow(1 + rate, flow.t));
		schedule.addRow([
			k + 1,
			flow.kind,
			flow.date,
			amount,
			eu ? flow.f : flow.t,
			eu ? flow.fText : flow.f,
			{
				formula: eu
					? `(1+solved_rate)^(-E${r})`
					: `1/((1+F${r}*solved_rate)*(1+solved_rate)^E${r})`,
				result: df
			},
			{ formula: `D${r}*G${r}`, result: amount * df }
		]);
		r++;
	}
	const totalPv = flows.reduce((s, flow) => {
		const amount = Number(flow.amount) * (flow.kind === 'advance' ? -1 : 1);
		const df = eu
			? Math.pow(1 + rate, -flow.f)
			: 1 / ((1 + flow.f * rate) * Math.pow(1 + rate, flow.t));
		return s + amount * df;
	}, 0);
	const sum = schedule.addRow([
		'',
		'total',
		'',
		'',
		'',
		'',
		'sum (≈ 0)',
		{ formula: `SUM(H5:H${r - 1})`, result: totalPv }
	]);
	sum.font = bold;
	schedule.addRow([
		'',
		'Advances are negative here and payments positive: the present value of the payments equals the amount financed, so the total is zero up to rounding.'
	]);
	for (let i = 5; i <= r; i++) {
		schedule.getCell(`D${i}`).numFmt = '#,##0.00';
		schedule.getCell(`G${i}`).numFmt = '0.000000000000';
		schedule.getCell(`H${i}`).numFmt = '#,##0.000000';
	}

	const disclosure = book.addWorksheet('Disclosure');
	disclosure.columns = [{ width: 40 }, { width: 48 }];
	const root = result.roots[0];
	const rows: [string, string][] = [
		['Amount financed', figures.amountFinanced],
		['Finance charge', figures.financeCharge],
		['Total of payments', figures.totalOfPayments],
		[
			eu ? 'APRC (percent, 1 decimal)' : 'APR (percent, 2 decimals)',
			result.disclosed ?? 'no rate exists'
		],
		['Status', result.status],
		['Rate (fraction)', result.rate ?? '—'],
		['Rate basis', result.rateBasis],
		['Certificate low', root?.certificate.low ?? '—'],
		['Certificate high', root?.certificate.high ?? '—'],
		['Unit period', result.unitPeriod?.label ?? (eu ? 'years from the first drawdown' : '—')],
		[
			'Regularity (1026.22)',
			result.regularity
				? `${result.regularity.classification}; tolerance ${result.regularity.tolerance}`
				: '—'
		],
		['Caution', CAUTION]
	];
	for (const row of rows) disclosure.addRow(row);
	disclosure.getColumn(1).font = bold;

	const trace = book.addWorksheet('Trace');
	trace.columns = [
		{ width: 12 },
		{ width: 10 },
		{ width: 26 },
		{ width: 26 },
		{ width: 26 },
		{ width: 30 },
		{ width: 20 }
	];
	if (input.trace) {
		for (const run of input.trace) {
			trace.addRow([
				`${run.method}: bracket [${run.bracket.low}, ${run.bracket.high}], predicted ${run.result.predictedIterations}, took ${run.result.iterations}, stopped by ${run.result.stoppedBy}`
			]).font = bold;
			trace.addRow(['method', 'iteration', 'low', 'high', 'point', 'NPV at point', 'width']).font =
				bold;
			for (const step of run.result.trace ?? []) {
				trace.addRow([
					run.method,
					step.iteration,
					step.low,
					step.high,
					step.point,
					step.value,
					(Number(step.high) - Number(step.low)).toExponential(3)
				]);
			}
			trace.addRow([]);
		}
	} else {
		trace.addRow(['No single rate was solved, so there is no trace to show.']);
	}
	return new Uint8Array(await book.xlsx.writeBuffer());
}
