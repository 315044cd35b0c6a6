// Calendar arithmetic for payment schedules, in UTC on YYYY-MM-DD strings.

const parse = (date: string) => date.split('-').map(Number) as [number, number, number];
const pad = (n: number) => String(n).padStart(2, '0');
export const daysInMonth = (year: number, month: number) =>
	new Date(Date.UTC(year, month, 0)).getUTCDate();

export function formatDate(year: number, month: number, day: number): string {
	return `${year}-${pad(month)}-${pad(day)}`;
}

/** `date` plus `months`, keeping the day of month of `anchorDay` and clamping at month end. */
export function addMonths(date: string, months: number, anchorDay = parse(date)[2]): string {
	const [y, m] = parse(date);
	const index = y * 12 + (m - 1) + months;
	const year = Math.floor(index / 12);
	const month = (index % 12) + 1;
	return formatDate(year, month, Math.min(anchorDay, daysInMonth(year, month)));
}

export function addDays(date: string, days: number): string {
	const [y, m, d] = parse(date);
	const t = new Date(Date.UTC(y, m - 1, d + days));
	return formatDate(t.getUTCFullYear(), t.getUTCMonth() + 1, t.getUTCDate());
}

export function daysBetween(from: string, to: string): number {
	const [a, b, c] = parse(from);
	const [x, y, z] = parse(to);
	return Math.round((Date.UTC(x, y - 1, z) - Date.UTC(a, b - 1, c)) / 86_400_000);
}

export type Frequency = 'monthly' | 'semimonthly' | 'biweekly' | 'weekly' | 'quarterly';

/**
 * Due dates of `count` payments from `first`. Semimonthly payments alternate between the first
 * payment's day and the day 15 later (or earlier, into the next month), clamped at month end.
 */
export function dueDates(first: string, count: number, frequency: Frequency): string[] {
	const dates: string[] = [];
	const [, , day] = parse(first);
	for (let k = 0; k < count; k++) {
		switch (frequency) {
			case 'monthly':
				dates.push(addMonths(first, k, day));
				break;
			case 'quarterly':
				dates.push(addMonths(first, 3 * k, day));
				break;
			case 'weekly':
				dates.push(addDays(first, 7 * k));
				break;
			case 'biweekly':
				dates.push(addDays(first, 14 * k));
				break;
			case 'semimonthly': {
				const half = k % 2;
				const months = Math.floor(k / 2);
				if (day <= 15) {
					dates.push(addMonths(first, months, half ? day + 15 : day));
				} else {
					dates.push(half ? addMonths(first, months + 1, day - 15) : addMonths(first, months, day));
				}
				break;
			}
		}
	}
	return dates;
}

export const periodsPerYear: Record<Frequency, number> = {
	monthly: 12,
	semimonthly: 24,
	biweekly: 26,
	weekly: 52,
	quarterly: 4
};
