// The demo workspace's loan files: invented borrowers and terms, for the demo only.
import type { LoanTerms } from '../../src/lib/schemas/loan.ts';
import type { LoanFile } from '../../src/lib/server/loans/file.ts';

const base: Omit<
	LoanTerms,
	| 'reference'
	| 'borrowerName'
	| 'amountOfCredit'
	| 'noteRate'
	| 'numberOfPayments'
	| 'advanceDate'
	| 'firstPaymentDate'
> = {
	regime: 'us-apr',
	securedByRealProperty: false,
	frequency: 'monthly',
	balloon: '',
	rounding: 'nearest',
	feeName: [],
	feeAmount: [],
	feeKind: []
};

const terms = (
	t: Partial<LoanTerms> &
		Pick<
			LoanTerms,
			| 'reference'
			| 'borrowerName'
			| 'amountOfCredit'
			| 'noteRate'
			| 'numberOfPayments'
			| 'advanceDate'
			| 'firstPaymentDate'
		>
): LoanFile => ({
	entryMode: 'terms',
	terms: { ...base, ...t }
});

export const DEMO_LOANS: {
	file: LoanFile;
	disclose?: boolean;
	check?: { apr: string; financeCharge?: string };
}[] = [
	{
		file: terms({
			reference: 'AUTO-2026-0101',
			borrowerName: 'Tamsin Okafor-Reyes',
			amountOfCredit: '24850.00',
			noteRate: '6.49',
			numberOfPayments: 60,
			advanceDate: '2026-09-14',
			firstPaymentDate: '2026-10-14',
			feeName: ['Documentation'],
			feeAmount: ['195.00'],
			feeKind: ['finance-charge-financed']
		}),
		disclose: true,
		check: { apr: '6.69' }
	},
	{
		file: terms({
			reference: 'AUTO-2026-0102',
			borrowerName: 'Bartholomew Quince',
			amountOfCredit: '17300.00',
			noteRate: '7.25',
			numberOfPayments: 48,
			advanceDate: '2026-10-02',
			firstPaymentDate: '2026-11-15'
		})
	},
	{
		file: terms({
			reference: 'AUTO-2026-0103',
			borrowerName: 'Ines Halvorsen',
			amountOfCredit: '31995.00',
			noteRate: '5.99',
			numberOfPayments: 72,
			advanceDate: '2026-10-20',
			firstPaymentDate: '2026-12-01',
			feeName: ['Title and registration', 'Origination'],
			feeAmount: ['310.00', '250.00'],
			feeKind: ['other-financed', 'finance-charge-cash']
		})
	},
	{
		file: terms({
			reference: 'PERS-2026-0201',
			borrowerName: 'Wilhelmina Strand',
			amountOfCredit: '5000.00',
			noteRate: '11.9',
			numberOfPayments: 36,
			advanceDate: '2026-08-03',
			firstPaymentDate: '2026-09-03'
		}),
		check: { apr: '11.90' }
	},
	{
		file: terms({
			reference: 'PERS-2026-0202',
			borrowerName: 'Rufus Ambrose-Kettle',
			amountOfCredit: '2500.00',
			noteRate: '14.5',
			numberOfPayments: 24,
			frequency: 'semimonthly',
			advanceDate: '2026-09-01',
			firstPaymentDate: '2026-09-15',
			feeName: ['Origination'],
			feeAmount: ['75.00'],
			feeKind: ['finance-charge-financed']
		})
	},
	{
		file: terms({
			reference: 'PERS-2026-0203',
			borrowerName: 'Cordelia Mbeki',
			amountOfCredit: '1200.00',
			noteRate: '17.0',
			numberOfPayments: 26,
			frequency: 'biweekly',
			advanceDate: '2026-10-05',
			firstPaymentDate: '2026-10-19'
		})
	},
	{
		file: terms({
			reference: 'PERS-2026-0204',
			borrowerName: 'Osric Penhallow',
			amountOfCredit: '800.00',
			noteRate: '18.0',
			numberOfPayments: 12,
			frequency: 'weekly',
			advanceDate: '2026-11-02',
			firstPaymentDate: '2026-11-09'
		})
	},
	{
		file: terms({
			reference: 'HOME-2026-0301',
			borrowerName: 'Marisol and Edwin Thackeray',
			securedByRealProperty: true,
			amountOfCredit: '42000.00',
			noteRate: '7.75',
			numberOfPayments: 120,
			advanceDate: '2026-06-18',
			firstPaymentDate: '2026-08-01',
			balloon: '9500.00',
			feeName: ['Origination', 'Appraisal'],
			feeAmount: ['840.00', '425.00'],
			feeKind: ['finance-charge-financed', 'other-cash']
		}),
		disclose: true
	},
	{
		file: terms({
			reference: 'HOME-2026-0302',
			borrowerName: 'Leopold Fairweather',
			amountOfCredit: '15000.00',
			noteRate: '8.25',
			numberOfPayments: 20,
			frequency: 'quarterly',
			advanceDate: '2026-07-01',
			firstPaymentDate: '2026-10-01'
		})
	},
	{
		file: terms({
			reference: 'EU-2026-0401',
			borrowerName: 'Annika Vesterlund',
			regime: 'eu-aprc',
			amountOfCredit: '8000.00',
			noteRate: '6.9',
			numberOfPayments: 36,
			advanceDate: '2026-09-10',
			firstPaymentDate: '2026-10-10',
			feeName: ['Arrangement fee'],
			feeAmount: ['120.00'],
			feeKind: ['finance-charge-cash']
		})
	},
	{
		file: {
			entryMode: 'schedule',
			header: {
				reference: 'BUILD-2026-0501',
				borrowerName: 'Hollowmere Joinery (owner-builder draws)',
				regime: 'us-apr',
				securedByRealProperty: false
			},
			rows: [
				{ kind: 'advance', date: '2026-04-01', amount: '10000.00' },
				{ kind: 'advance', date: '2026-06-01', amount: '8000.00' },
				...Array.from({ length: 24 }, (_, k) => {
					const index = 2026 * 12 + 6 + k;
					return {
						kind: 'payment' as const,
						date: `${Math.floor(index / 12)}-${String((index % 12) + 1).padStart(2, '0')}-01`,
						amount: k < 6 ? '150.00' : '1060.00'
					};
				})
			]
		}
	},
	{
		file: {
			entryMode: 'schedule',
			header: {
				reference: 'SKIP-2026-0502',
				borrowerName: 'Peregrine Oduya (seasonal skip)',
				regime: 'us-apr',
				securedByRealProperty: false
			},
			rows: [
				{ kind: 'advance', date: '2026-03-15', amount: '6000.00' },
				...[
					'2026-04-15',
					'2026-05-15',
					'2026-06-15',
					'2026-10-15',
					'2026-11-15',
					'2026-12-15',
					'2027-04-15',
					'2027-05-15',
					'2027-06-15',
					'2027-10-15'
				].map((date) => ({ kind: 'payment' as const, date, amount: '655.00' }))
			]
		}
	}
];
