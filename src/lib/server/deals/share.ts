// Exporting, e-mailing and comparing deals.
import Decimal from 'decimal.js';
import ExcelJS from 'exceljs';
import { appendAuditEvent } from '../audit/chain';
import { db } from '../db';
import { sendMail } from '../mail';
import { analyseDeal, investorFlows, type DealAnalysis } from './analysis';
import { getDeal, scenarioFamily } from './index';
import type { DealContent } from '../../schemas/deal';

type Found = NonNullable<Awaited<ReturnType<typeof getDeal>>>;

const percent = (fraction: string | null | undefined, places = 6) =>
	fraction === null || fraction === undefined
		? '—'
		: `${new Decimal(fraction).times(100).toFixed(places, Decimal.ROUND_HALF_UP)}%`;

/** One line per fact, for the e-mail and the Results sheet. */
function summary(name: string, a: DealAnalysis): [string, string][] {
	const rows: [string, string][] = [['Deal', name]];
	if (a.result.status === 'no-root')
		rows.push(['Rate', `No rate exists: ${a.result.reason?.message ?? ''}`]);
	else if (a.result.status === 'multiple-roots')
		rows.push([
			'Rates',
			`${a.rates.length} rates: ${a.rates.map((r) => percent(r.effectiveAnnual, 4)).join(', ')} effective per year — no single IRR`
		]);
	else
		rows.push([
			a.mode === 'dated' ? 'Dated IRR (effective per year)' : 'IRR (effective per year)',
			percent(a.rates[0]?.effectiveAnnual)
		]);
	rows.push(
		['NPV at the hurdle', a.npvAtHurdle],
		['MIRR (effective per year)', a.mirrAnnual ? percent(a.mirrAnnual) : '—']
	);
	rows.push([
		'Simple payback',
		a.payback.simple.reached
			? 'period' in a.payback.simple
				? `period ${a.payback.simple.period}`
				: `${a.payback.simple.years} years`
			: a.payback.simple.message
	]);
	return rows;
}

export async function dealWorkbook(
	name: string,
	content: DealContent,
	a: DealAnalysis
): Promise<Uint8Array> {
	const book = new ExcelJS.Workbook();
	book.creator = 'Pincer';
	const bold = { bold: true };
	const flows = investorFlows(content);
	const dated = flows.mode === 'dated';

	const sheet = book.addWorksheet('Flows');
	const rate = a.result.roots.length ? Number(a.result.roots[0].rate) : 0;
	sheet.getCell('A1').value = dated ? 'Rate (effective per year)' : 'Rate per period';
	sheet.getCell('A1').font = bold;
	sheet.getCell('B1').value = rate;
	sheet.getCell('B1').numFmt = '0.000000000000000';
	sheet.getCell('C1').value = a.result.roots.length
		? `exact: ${a.result.roots[0].rate}${a.result.roots.length > 1 ? ` (first of ${a.result.roots.length} rates)` : ''}`
		: 'no rate exists: discounting at 0';
	book.definedNames.add(`'Flows'!$B$1`, 'deal_rate');
	sheet.getRow(3).values = dated
		? ['#', 'date', 'years from first', 'amount', 'discount factor', 'present value']
		: ['#', 'period', '', 'amount', 'discount factor', 'present value'];
	sheet.getRow(3).font = bold;
	sheet.columns = [8, 14, 16, 18, 18, 18].map((width) => ({ width }));
	const items = dated
		? flows.dated.map((f) => ({
				key: f.date,
				t:
					(Date.parse(f.date) - Date.parse(flows.dated[0].date)) /
					86_400_000 /
					(content.dayCount === 'act/360' ? 360 : 365),
				amount: Number(f.amount)
			}))
		: flows.periodic.map((amount, k) => ({ key: k, t: k, amount: Number(amount) }));
	let r = 4;
	let total = 0;
	for (const [k, item] of items.entries()) {
		const df = Math.pow(1 + rate, -item.t);
		total += item.amount * df;
		sheet.addRow([
			k + 1,
			item.key,
			dated ? item.t : '',
			item.amount,
			{ formula: dated ? `(1+deal_rate)^(-C${r})` : `(1+deal_rate)^(-B${r})`, result: df },
			{ formula: `D${r}*E${r}`, result: item.amount * df }
		]);
		r++;
	}
	sheet.addRow([
		'',
		'total',
		'',
		'',
		'sum (≈ 0)',
		{ formula: `SUM(F4:F${r - 1})`, result: total }
	]).font = bold;

	const results = book.addWorksheet('Results');
	results.columns = [{ width: 34 }, { width: 70 }];
	for (const row of summary(name, a)) results.addRow(row);
	for (const [i, root] of a.result.roots.entries())
		results.addRow([
			`Root ${i + 1} certificate`,
			`[${root.certificate.low}, ${root.certificate.high}]`
		]);
	results.addRow(['Uniqueness', a.result.uniqueness.explanation]);
	results.getColumn(1).font = bold;

	const profile = book.addWorksheet('NPV profile');
	profile.addRow([a.rateUnit, 'NPV']).font = bold;
	for (const p of a.profile) profile.addRow([p.rate, p.npv]);

	const trace = book.addWorksheet('Trace');
	trace.addRow(['root', 'iteration', 'low', 'high', 'point', 'NPV at point']).font = bold;
	for (const s of a.result.trace ?? [])
		trace.addRow([s.root + 1, s.iteration, s.low, s.high, s.point, s.value]);
	return new Uint8Array(await book.xlsx.writeBuffer());
}

export async function emailDeal(
	acting: { workspaceId: string; actorId: string; senderName: string },
	found: Found,
	to: string
) {
	const a = analyseDeal(found.content);
	const lines = summary(found.deal.name, a).map(([k, v]) => `${k}: ${v}`);
	lines.push(
		`Sent by ${acting.senderName} from Pincer. The attached workbook holds the flows with formulas that recompute each present value, the results, the NPV profile and the trace.`
	);
	const workbook = await dealWorkbook(found.deal.name, found.content, a);
	await sendMail({
		to,
		subject: `Deal summary: ${found.deal.name}`,
		text: lines.join('\n\n'),
		html: `<div style="font:15px/1.5 system-ui,sans-serif">${lines.map((l) => `<p>${l.replace(/[&<>]/g, (c) => `&#${c.charCodeAt(0)};`)}</p>`).join('')}</div>`,
		attachments: [
			{
				filename: `pincer-deal-${found.deal.name.replace(/[^\w-]+/g, '_')}-v${found.version}.xlsx`,
				content: Buffer.from(workbook)
			}
		]
	});
	await db.transaction((tx) =>
		appendAuditEvent(tx, {
			workspaceId: acting.workspaceId,
			actorId: acting.actorId,
			action: 'deal.email',
			subject: `deal:${found.deal.id}`,
			payload: { to, version: found.version }
		})
	);
}

/** The base deal and its scenarios side by side: rates, NPV at the hurdle, MIRR, payback. */
export async function compareScenarios(workspaceId: string, dealId: string) {
	const family = await scenarioFamily(workspaceId, dealId);
	if (family.length < 2) return [];
	const rows = [];
	for (const member of family) {
		const found = await getDeal(workspaceId, member.id);
		if (!found) continue;
		const a = analyseDeal(found.content);
		rows.push({
			id: member.id,
			name: member.name,
			isBase: !member.scenarioOf,
			status: a.result.status,
			rates: a.rates.map((r) => r.effectiveAnnual),
			npvAtHurdle: a.npvAtHurdle,
			mirr: a.mirrAnnual,
			payback: a.payback.simple.reached
				? 'period' in a.payback.simple
					? `period ${new Decimal(a.payback.simple.period).toFixed(2)}`
					: `${new Decimal(a.payback.simple.years).toFixed(2)} years`
				: 'not reached'
		});
	}
	return rows;
}
