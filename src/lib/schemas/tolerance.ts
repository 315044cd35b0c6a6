import { z } from 'zod';

/** The Tolerance check form: the APR the officer intends to disclose, and optionally the finance charge. */
export const toleranceCheckSchema = z.object({
	disclosedApr: z
		.string()
		.trim()
		.min(1, { error: 'Enter the APR you intend to disclose, in percent (e.g. 12.83).' })
		.regex(/^\d{1,3}(\.\d{1,6})?$/, {
			error: 'Write the APR in percent, such as 12.83 (no % sign).'
		}),
	disclosedFinanceCharge: z
		.string()
		.trim()
		.transform((v) => v.replace(/,/g, ''))
		.pipe(
			z.string().regex(/^(\d{1,12}(\.\d{1,2})?)?$/, {
				error: 'Write the finance charge as an amount such as 209.96.'
			})
		)
		.optional()
});

export const emailDisclosureSchema = z.object({
	to: z
		.string()
		.trim()
		.toLowerCase()
		.pipe(z.email({ error: 'Enter the e-mail address to send the disclosure to.' }))
});
