// A deal's cash flows and analysis settings: shared by the deal page (client), its JSON
// endpoint, the REST API and the API reference. Amounts are decimal strings; rates are
// percents per year as analysts type them ("8" means 8% a year).
import { z } from 'zod';

const AMOUNT = /^[+-]?\d{1,24}(\.\d{1,12})?$/;
const PERCENT = /^-?\d{1,4}(\.\d{1,8})?$/;

const isDate = (text: string) => {
	if (!/^\d{4}-\d{2}-\d{2}$/.test(text)) return false;
	const [y, m, d] = text.split('-').map(Number);
	const t = new Date(Date.UTC(y, m - 1, d));
	return y >= 1900 && y <= 2200 && t.getUTCMonth() === m - 1 && t.getUTCDate() === d;
};

const percent = (what: string) =>
	z
		.string()
		.trim()
		.regex(PERCENT, { error: `${what} is a percent per year such as 8 or 7.5.` });

export const dealFlowSchema = z.object({
	date: z.string().trim().optional().describe('YYYY-MM-DD (dated mode)'),
	period: z
		.number()
		.int()
		.min(0)
		.max(100_000)
		.optional()
		.describe('Whole period from 0 (periodic mode)'),
	amount: z.string().trim().describe('Decimal string; negative for money out in the investor view'),
	label: z.string().trim().max(120).optional()
});
export type DealFlow = z.infer<typeof dealFlowSchema>;

export const dealContentSchema = z
	.object({
		mode: z.enum(['dated', 'periodic']).describe('Dated flows, or equal periods'),
		periodsPerYear: z
			.number()
			.int()
			.min(1)
			.max(366)
			.default(12)
			.describe('Periodic mode: periods per year'),
		dayCount: z.enum(['act/365', 'act/360', 'act/act']).default('act/365'),
		signConvention: z.enum(['investor', 'borrower']).default('investor'),
		hurdleRate: percent('The hurdle rate').default('8'),
		financeRate: percent('The finance rate').default('6'),
		reinvestRate: percent('The reinvestment rate').default('8'),
		method: z.enum(['bisection', 'itp']).default('bisection'),
		rateTolerance: z
			.string()
			.trim()
			.regex(/^\d+(\.\d+)?([eE]-?\d+)?$/, {
				error: 'The rate tolerance is a small number such as 1e-12.'
			})
			.default('1e-12'),
		residualTolerance: z
			.string()
			.trim()
			.regex(/^(\d+(\.\d+)?([eE]-?\d+)?)?$/, {
				error: 'The residual tolerance is a small amount such as 0.001, or empty.'
			})
			.default(''),
		maxIterations: z.number().int().min(1).max(1000).default(200),
		combine: z.enum(['any', 'all']).default('any'),
		profileLow: percent('The chart’s lowest rate').default('-50'),
		profileHigh: percent('The chart’s highest rate').default('100'),
		scanLow: percent('The lowest rate to search')
			.or(z.literal(''))
			.default('')
			.describe('Search for rates only from here (% per year); empty: the whole admissible range'),
		scanHigh: percent('The highest rate to search')
			.or(z.literal(''))
			.default('')
			.describe('Search for rates only up to here (% per year)'),
		flows: z.array(dealFlowSchema).max(100_000)
	})
	.superRefine((deal, ctx) => {
		if (deal.flows.length < 2) {
			ctx.addIssue({
				code: 'custom',
				path: ['flows'],
				message: 'Enter at least two cash flows: an outlay and a return.'
			});
		}
		deal.flows.forEach((flow, i) => {
			if (!AMOUNT.test(flow.amount)) {
				ctx.addIssue({
					code: 'custom',
					path: ['flows', i, 'amount'],
					message: `Row ${i + 1}: "${flow.amount}" is not an amount such as -1000 or 250.50.`
				});
			}
			if (deal.mode === 'dated' && !isDate(flow.date ?? '')) {
				ctx.addIssue({
					code: 'custom',
					path: ['flows', i, 'date'],
					message: `Row ${i + 1}: write the date as 2026-03-15.`
				});
			}
			if (deal.mode === 'periodic' && flow.period === undefined) {
				ctx.addIssue({
					code: 'custom',
					path: ['flows', i, 'period'],
					message: `Row ${i + 1}: enter the period (0, 1, 2, …).`
				});
			}
		});
		if ((deal.scanLow === '') !== (deal.scanHigh === '')) {
			ctx.addIssue({
				code: 'custom',
				path: ['scanHigh'],
				message: 'Give both ends of the search range, or neither.'
			});
		} else if (
			deal.scanLow !== '' &&
			(Number(deal.scanLow) >= Number(deal.scanHigh) || Number(deal.scanLow) <= -100)
		) {
			ctx.addIssue({
				code: 'custom',
				path: ['scanHigh'],
				message: 'The search range must run from above −100% to a higher rate.'
			});
		}
		if (Number(deal.profileLow) >= Number(deal.profileHigh)) {
			ctx.addIssue({
				code: 'custom',
				path: ['profileHigh'],
				message: 'The chart’s highest rate must be above its lowest.'
			});
		}
		if (Number(deal.profileLow) <= -100) {
			ctx.addIssue({
				code: 'custom',
				path: ['profileLow'],
				message: 'Rates must stay above −100%.'
			});
		}
	});
export type DealContent = z.output<typeof dealContentSchema>;
export type DealContentInput = z.input<typeof dealContentSchema>;

export const dealCreateSchema = z.object({
	name: z.string().trim().min(1, { error: 'Name the deal.' }).max(120),
	content: dealContentSchema
});
