// The loan file's Terms form and schedule entry, shared by the form actions, the REST API and
// the API reference. Money is a decimal string with at most two decimals; the note rate is a
// percent per year as loan systems show it ("9.5" means 9.5% a year).
import Decimal from 'decimal.js';
import { z } from 'zod';

const MONEY = /^\d{1,12}(\.\d{1,2})?$/;
const PERCENT = /^\d{1,3}(\.\d{1,6})?$/;
const DATE = /^\d{4}-\d{2}-\d{2}$/;

/** Accepts "1,234.50" and " 1234.5 " as typed; stores "1234.50"-style digits without separators. */
const cleanMoney = (v: unknown) => (typeof v === 'string' ? v.trim().replace(/,/g, '') : v);

export const isCalendarDate = (text: string) => {
	if (!DATE.test(text)) return false;
	const [y, m, d] = text.split('-').map(Number);
	const date = new Date(Date.UTC(y, m - 1, d));
	return y >= 1900 && y <= 2200 && date.getUTCMonth() === m - 1 && date.getUTCDate() === d;
};

export const money = (what: string) =>
	z.preprocess(
		cleanMoney,
		z
			.string({ error: `Enter the ${what}.` })
			.min(1, { error: `Enter the ${what}.` })
			.regex(MONEY, {
				error: `The ${what} must be an amount such as 1250.00 (no letters, at most two decimals).`
			})
	);

const calendarDate = (what: string) =>
	z
		.string({ error: `Enter the ${what}.` })
		.min(1, { error: `Enter the ${what}.` })
		.refine(isCalendarDate, { error: `The ${what} must be a real date written 2026-03-15.` });

export const frequencies = ['monthly', 'semimonthly', 'biweekly', 'weekly', 'quarterly'] as const;
export const feeKinds = [
	'finance-charge-cash',
	'finance-charge-financed',
	'other-cash',
	'other-financed'
] as const;
export const roundingRules = ['nearest', 'up', 'down'] as const;

export const loanTermsSchema = z
	.object({
		reference: z.string().trim().min(1, { error: 'Enter the loan reference.' }).max(60),
		borrowerName: z.string().trim().min(1, { error: "Enter the borrower's name." }).max(120),
		regime: z.enum(['us-apr', 'eu-aprc'], { error: 'Choose the regime.' }),
		securedByRealProperty: z.boolean().default(false),
		amountOfCredit: money('amount of credit').refine((v) => new Decimal(v).gt(0), {
			error: 'The amount of credit must be more than zero.'
		}),
		noteRate: z.preprocess(
			cleanMoney,
			z.string().min(1, { error: 'Enter the note rate.' }).regex(PERCENT, {
				error: 'The note rate is a percent per year such as 9.5 (no % sign needed).'
			})
		),
		numberOfPayments: z.coerce
			.number({ error: 'Enter the number of payments.' })
			.int({ error: 'The number of payments is a whole number.' })
			.min(1, { error: 'A loan needs at least one payment.' })
			.max(1200, { error: 'At most 1,200 payments.' }),
		frequency: z.enum(frequencies, { error: 'Choose how often payments fall due.' }),
		advanceDate: calendarDate('date of the advance'),
		firstPaymentDate: calendarDate('first payment date'),
		balloon: z.preprocess(
			cleanMoney,
			z
				.string()
				.regex(MONEY, { error: 'The balloon must be an amount such as 5000.00, or left empty.' })
				.optional()
				.or(z.literal(''))
		),
		rounding: z.enum(roundingRules).default('nearest'),
		feeName: z.array(z.string().trim().max(80)).default([]),
		feeAmount: z.array(z.preprocess(cleanMoney, z.string())).default([]),
		feeKind: z.array(z.enum(feeKinds)).default([])
	})
	.superRefine((terms, ctx) => {
		if (
			isCalendarDate(terms.advanceDate) &&
			isCalendarDate(terms.firstPaymentDate) &&
			terms.firstPaymentDate <= terms.advanceDate
		) {
			ctx.addIssue({
				code: 'custom',
				path: ['firstPaymentDate'],
				message: 'The first payment must fall after the date of the advance.'
			});
		}
		let financed = new Decimal(0);
		let prepaid = new Decimal(0);
		terms.feeAmount.forEach((amount, i) => {
			const name = terms.feeName[i] ?? '';
			if (!amount && !name) return;
			if (!MONEY.test(amount)) {
				ctx.addIssue({
					code: 'custom',
					path: ['feeAmount', i],
					message: `Fee ${i + 1}${name ? ` (${name})` : ''}: enter an amount such as 95.00.`
				});
				return;
			}
			const kind = terms.feeKind[i] ?? 'finance-charge-cash';
			if (kind.startsWith('finance-charge')) prepaid = prepaid.plus(amount);
			if (kind.endsWith('financed')) financed = financed.plus(amount);
		});
		if (MONEY.test(terms.amountOfCredit) && prepaid.gte(financed.plus(terms.amountOfCredit))) {
			ctx.addIssue({
				code: 'custom',
				path: ['feeAmount'],
				message:
					'The prepaid finance charges are as large as the credit itself: nothing would be financed.'
			});
		}
		if (terms.balloon && terms.numberOfPayments < 2) {
			ctx.addIssue({
				code: 'custom',
				path: ['balloon'],
				message: 'A balloon needs at least two payments.'
			});
		}
	});

export type LoanTerms = z.output<typeof loanTermsSchema>;

/** One row of schedule entry: an advance (money to the borrower) or a payment (money back). */
export const scheduleRowSchema = z.object({
	kind: z.enum(['advance', 'payment']),
	date: calendarDate('date'),
	amount: money('amount').refine((v) => new Decimal(v).gt(0), {
		error: 'Amounts must be more than zero.'
	})
});
export type ScheduleRow = z.output<typeof scheduleRowSchema>;

/** Schedule entry: the loan's header plus rows typed into the table or pasted from a spreadsheet. */
export const scheduleEntrySchema = z
	.object({
		reference: z.string().trim().min(1, { error: 'Enter the loan reference.' }).max(60),
		borrowerName: z.string().trim().min(1, { error: "Enter the borrower's name." }).max(120),
		regime: z.enum(['us-apr', 'eu-aprc'], { error: 'Choose the regime.' }),
		securedByRealProperty: z.boolean().default(false),
		rowKind: z.array(z.enum(['advance', 'payment'])).default([]),
		rowDate: z.array(z.string().trim()).default([]),
		rowAmount: z.array(z.preprocess(cleanMoney, z.string())).default([]),
		paste: z.string().max(2_000_000).default('')
	})
	.superRefine((entry, ctx) => {
		entry.rowDate.forEach((date, i) => {
			const amount = entry.rowAmount[i] ?? '';
			if (!date && !amount) return;
			if (!isCalendarDate(date)) {
				ctx.addIssue({
					code: 'custom',
					path: ['rowDate', i],
					message: `Row ${i + 1}: write the date as 2026-03-15.`
				});
			}
			if (!MONEY.test(amount) || new Decimal(amount).lte(0)) {
				ctx.addIssue({
					code: 'custom',
					path: ['rowAmount', i],
					message: `Row ${i + 1}: enter an amount above zero such as 250.00.`
				});
			}
		});
	});
export type ScheduleEntry = z.output<typeof scheduleEntrySchema>;

/**
 * Rows pasted from a spreadsheet: one per line, cells separated by tabs (or commas/semicolons):
 * date, amount and optionally "advance" or "payment". Without that third cell the first row is
 * the advance and the rest are payments. Returns rows or the first problem, naming the line.
 */
export function parsePastedRows(
	text: string
): { rows: ScheduleRow[] } | { line: number; message: string } {
	const rows: ScheduleRow[] = [];
	const lines = text.split(/\r?\n/);
	for (const [index, raw] of lines.entries()) {
		if (!raw.trim()) continue;
		const separator = raw.includes('\t') ? '\t' : raw.includes(';') ? ';' : ',';
		const cells = raw.split(separator).map((c) => c.trim());
		const [date, rawAmount, rawKind] = cells;
		const amount = (rawAmount ?? '').replace(/[,\s$€£]/g, '');
		if (index === 0 && !isCalendarDate(date) && !MONEY.test(amount)) continue; // a header line
		if (!isCalendarDate(date ?? ''))
			return {
				line: index + 1,
				message: `Line ${index + 1}: "${date ?? ''}" is not a date written 2026-03-15.`
			};
		if (!MONEY.test(amount) || new Decimal(amount).lte(0)) {
			return {
				line: index + 1,
				message: `Line ${index + 1}: "${rawAmount ?? ''}" is not an amount above zero.`
			};
		}
		const kind = rawKind?.toLowerCase();
		if (kind && kind !== 'advance' && kind !== 'payment') {
			return {
				line: index + 1,
				message: `Line ${index + 1}: the third cell must be "advance" or "payment".`
			};
		}
		rows.push({
			kind:
				(kind as 'advance' | 'payment' | undefined) ?? (rows.length === 0 ? 'advance' : 'payment'),
			date,
			amount
		});
	}
	return { rows };
}

/** The header of a loan file imported from a spreadsheet. */
export const loanHeaderSchema = z.object({
	reference: z.string().trim().min(1, { error: 'Enter the loan reference.' }).max(60),
	borrowerName: z.string().trim().min(1, { error: "Enter the borrower's name." }).max(120),
	regime: z.enum(['us-apr', 'eu-aprc'], { error: 'Choose the regime.' }),
	securedByRealProperty: z.preprocess((v) => v === 'on' || v === 'true' || v === true, z.boolean())
});
