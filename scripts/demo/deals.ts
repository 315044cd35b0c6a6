// The demo workspace's deals: invented projects and figures, for the demo only.
import type { DealContentInput } from '../../src/lib/schemas/deal.ts';

const monthly = Array.from({ length: 60 }, (_, k) => ({
	period: k + 1,
	amount: k === 59 ? '1059500.00' : '9500.00',
	label: k === 59 ? 'rent and sale of the building' : 'rent'
}));

export const DEMO_DEALS: {
	name: string;
	content: DealContentInput;
	scenario?: (c: DealContentInput) => DealContentInput;
}[] = [
	{
		name: 'Lanternfield Wind Repower',
		content: {
			mode: 'dated',
			dayCount: 'act/365',
			hurdleRate: '9',
			profileLow: '-10',
			profileHigh: '40',
			flows: [
				{ date: '2026-06-30', amount: '-20000000.00', label: 'repowering works' },
				{
					date: '2027-06-30',
					amount: '44000000.00',
					label: 'offtake contract buy-out and first year of generation'
				},
				{
					date: '2028-06-30',
					amount: '-24168000.00',
					label: 'decommissioning and site restoration'
				}
			]
		}
	},
	{
		name: 'Orchard Row Warehouse Lease',
		content: {
			mode: 'periodic',
			periodsPerYear: 12,
			hurdleRate: '7',
			flows: [{ period: 0, amount: '-1250000.00', label: 'purchase and fit-out' }, ...monthly]
		},
		scenario: (c) => ({
			...c,
			flows: c.flows.map((f) => (f.label === 'rent' ? { ...f, amount: '8800.00' } : f))
		})
	},
	{
		name: 'Copperleaf Solar Canopy',
		content: {
			mode: 'dated',
			hurdleRate: '8',
			flows: [
				{ date: '2026-02-01', amount: '-840000.00', label: 'installation' },
				{ date: '2026-12-31', amount: '96000.00' },
				{ date: '2027-12-31', amount: '118000.00' },
				{ date: '2028-12-31', amount: '121000.00' },
				{ date: '2029-12-31', amount: '124000.00' },
				{ date: '2030-12-31', amount: '127000.00' },
				{ date: '2031-12-31', amount: '130000.00' },
				{ date: '2032-12-31', amount: '133000.00' },
				{ date: '2033-12-31', amount: '260000.00', label: 'final year and resale of panels' }
			]
		}
	}
];
