import { appendAuditEvent } from '../audit/chain';
import { db } from '../db';
import { sendMail } from '../mail';
import { formatLine } from './text';
import { CAUTION } from './disclosure';
import type { getLoan } from './index';
import { loanView } from './view';
import { loanWorkbook } from './export';

type Found = NonNullable<Awaited<ReturnType<typeof getLoan>>>;

/** E-mails the disclosure summary with the workbook attached, and audits the sending. */
export async function emailDisclosure(
	acting: { workspaceId: string; actorId: string; senderName: string },
	found: Found,
	to: string
) {
	const view = loanView(found.file, found.solve);
	const result = view.result;
	const eu = view.header.regime === 'eu-aprc';
	const rateLine =
		result?.status === 'solved'
			? `${eu ? 'APRC' : 'Annual percentage rate'}: ${result.disclosed}%`
			: `${eu ? 'APRC' : 'Annual percentage rate'}: no single rate exists for this schedule (${result?.reason?.message ?? result?.status})`;
	const lines = [
		`Loan ${view.header.reference} — ${view.header.borrowerName} (version ${found.version.version})`,
		rateLine,
		formatLine('Amount financed', view.figures.amountFinanced),
		formatLine('Finance charge', view.figures.financeCharge),
		formatLine('Total of payments', view.figures.totalOfPayments),
		`Sent by ${acting.senderName} from Pincer. The attached workbook holds the terms, the schedule with formulas that recompute each payment's present value, the disclosure and the trace.`,
		CAUTION
	];
	const workbook = await loanWorkbook({
		file: found.file,
		figures: view.figures,
		result: result!,
		version: found.version.version,
		engineVersion: found.solve?.engineVersion ?? '',
		trace: null
	});
	const html = `<div style="font:15px/1.5 system-ui,sans-serif;color:#23201b">${lines.map((l) => `<p>${l.replace(/[&<>]/g, (c) => `&#${c.charCodeAt(0)};`)}</p>`).join('')}</div>`;
	await sendMail({
		to,
		subject: `Disclosure for loan ${view.header.reference}`,
		text: lines.join('\n\n'),
		html,
		attachments: [
			{
				filename: `pincer-loan-${view.header.reference.replace(/[^\w-]+/g, '_')}-v${found.version.version}.xlsx`,
				content: Buffer.from(workbook)
			}
		]
	});
	await db.transaction((tx) =>
		appendAuditEvent(tx, {
			workspaceId: acting.workspaceId,
			actorId: acting.actorId,
			action: 'loan.email',
			subject: `loan:${found.loan.id}`,
			payload: { to, version: found.version.version }
		})
	);
}
