// Builds a loan's payment schedule from its terms and the Regulation Z / EU figures that follow
// from it. Pure decimal arithmetic (money to the cent), no I/O.
import Decimal from 'decimal.js';
import type { LoanTerms, ScheduleRow } from '../../schemas/loan';
import { addDays, addMonths, daysBetween, dueDates, periodsPerYear, type Frequency } from './dates';

const D = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_HALF_UP });
type D = Decimal;
const cents = (x: D, mode: Decimal.Rounding = Decimal.ROUND_HALF_UP) => x.toDecimalPlaces(2, mode);
const money = (x: D) => cents(x).toFixed(2);

export type Payment = {
	number: number;
	date: string;
	amount: string;
	interest: string;
	principal: string;
	balance: string;
};

export type LoanFigures = {
	/** The note amount: amount of credit plus every fee that is financed. */
	noteAmount: string;
	prepaidFinanceCharge: string;
	/** 12 CFR 1026.18(b): note amount less prepaid finance charges (however paid). */
	amountFinanced: string;
	/** Sum of every scheduled payment (1026.18(h)). */
	totalOfPayments: string;
	/** 1026.18(d): total of payments less amount financed. */
	financeCharge: string;
	advances: { date: string; amount: string }[];
	payments: Payment[];
	/** Days of the first period beyond one regular period (negative when it is short). */
	oddDays: number | null;
	levelPayment: string | null;
};

const rounding = {
	nearest: Decimal.ROUND_HALF_UP,
	up: Decimal.ROUND_UP,
	down: Decimal.ROUND_DOWN
} as const;
const basisDays: Record<Frequency, number> = {
	monthly: 30,
	semimonthly: 15,
	biweekly: 14,
	weekly: 7,
	quarterly: 90
};

function periodBefore(date: string, frequency: Frequency): string {
	switch (frequency) {
		case 'monthly':
			return addMonths(date, -1);
		case 'quarterly':
			return addMonths(date, -3);
		case 'semimonthly':
			return addDays(date, -15);
		case 'biweekly':
			return addDays(date, -14);
		case 'weekly':
			return addDays(date, -7);
	}
}

/** Fee totals: what is added to the note and what is a prepaid finance charge. */
export function feeTotals(terms: Pick<LoanTerms, 'feeName' | 'feeAmount' | 'feeKind'>) {
	let financed = new D(0);
	let prepaidFinanceCharge = new D(0);
	const fees: { name: string; amount: string; kind: string }[] = [];
	terms.feeAmount.forEach((amount, i) => {
		if (!amount) return;
		const kind = terms.feeKind[i] ?? 'finance-charge-cash';
		if (kind.endsWith('financed')) financed = financed.plus(amount);
		if (kind.startsWith('finance-charge')) prepaidFinanceCharge = prepaidFinanceCharge.plus(amount);
		fees.push({ name: terms.feeName[i] || `Fee ${i + 1}`, amount: money(new D(amount)), kind });
	});
	return { financed, prepaidFinanceCharge, fees };
}

/**
 * The schedule Pincer builds from terms: a level payment from the note rate (percent per year,
 * nominal, compounded per payment period), rounded to cents by the chosen rule, the last
 * payment absorbing the rounding. Interest for an odd first period is simple interest on the
 * extra days over a 30-day month (15-day semimonth, 7-day week) — common practice for notes.
 */
export function scheduleFromTerms(terms: LoanTerms): LoanFigures {
	const { financed, prepaidFinanceCharge } = feeTotals(terms);
	const note = new D(terms.amountOfCredit).plus(financed);
	const n = terms.numberOfPayments;
	const i = new D(terms.noteRate).div(100).div(periodsPerYear[terms.frequency]);
	const previous = periodBefore(terms.firstPaymentDate, terms.frequency);
	const oddDays = daysBetween(terms.advanceDate, previous);
	const basis = basisDays[terms.frequency];
	// Growth of the balance over the first period.
	const firstGrowth =
		oddDays >= 0
			? i.times(oddDays).div(basis).plus(1).times(i.plus(1))
			: i.times(daysBetween(terms.advanceDate, terms.firstPaymentDate)).div(basis).plus(1);
	const balloon = terms.balloon ? new D(terms.balloon) : null;
	const v = new D(1).div(i.plus(1));
	// Present value, at the advance, of 1 paid at each of payments 1..m.
	const annuity = (m: number) => {
		let sum = new D(0);
		for (let k = 0; k < m; k++) sum = sum.plus(v.pow(k));
		return sum.div(firstGrowth);
	};
	const level = balloon
		? note.minus(balloon.times(v.pow(n - 1)).div(firstGrowth)).div(annuity(n - 1))
		: note.div(annuity(n));
	const payment = cents(level, rounding[terms.rounding]);
	const dates = dueDates(terms.firstPaymentDate, n, terms.frequency);
	const payments: Payment[] = [];
	let balance = note;
	for (let k = 0; k < n; k++) {
		const interest = cents(k === 0 ? balance.times(firstGrowth.minus(1)) : balance.times(i));
		const last = k === n - 1;
		const amount = last ? balance.plus(interest) : D.min(payment, balance.plus(interest));
		const principal = amount.minus(interest);
		balance = balance.minus(principal);
		payments.push({
			number: k + 1,
			date: dates[k],
			amount: money(amount),
			interest: money(interest),
			principal: money(principal),
			balance: money(balance)
		});
	}
	return figures(
		note,
		prepaidFinanceCharge,
		[{ date: terms.advanceDate, amount: note.minus(prepaidFinanceCharge) }],
		payments,
		oddDays,
		money(payment)
	);
}

/** The same figures for a schedule the officer entered row by row (advances and payments). */
export function scheduleFromRows(rows: ScheduleRow[]): LoanFigures {
	const sorted = [...rows].sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : 0));
	const advances = sorted
		.filter((r) => r.kind === 'advance')
		.map((r) => ({ date: r.date, amount: new D(r.amount) }));
	let total = advances.reduce((s, a) => s.plus(a.amount), new D(0));
	const note = total;
	const payments: Payment[] = sorted
		.filter((r) => r.kind === 'payment')
		.map((r, k) => {
			total = total.minus(r.amount);
			return {
				number: k + 1,
				date: r.date,
				amount: money(new D(r.amount)),
				interest: '',
				principal: '',
				balance: ''
			};
		});
	return figures(note, new D(0), advances, payments, null, null);
}

function figures(
	note: D,
	prepaid: D,
	advances: { date: string; amount: D }[],
	payments: Payment[],
	oddDays: number | null,
	levelPayment: string | null
): LoanFigures {
	const amountFinanced = note.minus(prepaid);
	const totalOfPayments = payments.reduce((s, p) => s.plus(p.amount), new D(0));
	return {
		noteAmount: money(note),
		prepaidFinanceCharge: money(prepaid),
		amountFinanced: money(amountFinanced),
		totalOfPayments: money(totalOfPayments),
		financeCharge: money(totalOfPayments.minus(amountFinanced)),
		advances: advances.map((a) => ({ date: a.date, amount: money(a.amount) })),
		payments,
		oddDays,
		levelPayment
	};
}

/** Payments grouped the way disclosures show them: runs of equal amounts with their due dates. */
export function groupPayments(payments: Pick<Payment, 'date' | 'amount'>[]) {
	const groups: { count: number; amount: string; first: string; last: string }[] = [];
	for (const p of payments) {
		const current = groups.at(-1);
		if (current && current.amount === p.amount) {
			current.count += 1;
			current.last = p.date;
		} else groups.push({ count: 1, amount: p.amount, first: p.date, last: p.date });
	}
	return groups;
}
