/*
 * Which column probably holds what: by the header's words first, then, for dates and amounts,
 * by the content of the first rows. Only a suggestion; the user confirms the mapping.
 */

import { readDate } from './upload-dates';
import { SAMPLE_ROW_COUNT, type Loaded } from './upload-file';
import type { SheetCell } from './upload-sheet';
import { readAmount } from './upload-values';

export type ColumnRole = 'date' | 'period' | 'amount' | 'label';

const BLANK: SheetCell = { kind: 'blank' };

const ROLE_WORDS: Record<ColumnRole, string[]> = {
	date: ['date', 'value date', 'payment date', 'flow date', 'day', 'when'],
	period: ['period', 'periods', 'period number', 'year', 'month', 'quarter', 'n', 't'],
	amount: ['amount', 'cash flow', 'cashflow', 'flow', 'net', 'value', 'payment', 'sum'],
	label: ['label', 'description', 'memo', 'note', 'notes', 'name', 'item', 'details', 'comment']
};

/** A column for each role: by header words first, then by content for date and amount. */
export function suggestColumns(loaded: Loaded): Partial<Record<ColumnRole, number>> {
	const names = loaded.columns.map((name) =>
		name
			.toLowerCase()
			.replace(/[^\p{L}\p{N}]+/gu, ' ')
			.trim()
	);
	const taken = new Set<number>();
	const suggested: Partial<Record<ColumnRole, number>> = {};
	const pick = (role: ColumnRole, test: (index: number) => boolean) => {
		if (suggested[role] !== undefined) return;
		const index = names.findIndex((_, i) => !taken.has(i) && test(i));
		if (index >= 0) {
			suggested[role] = index;
			taken.add(index);
		}
	};
	const roles: ColumnRole[] = ['date', 'period', 'amount', 'label'];
	for (const role of roles) pick(role, (i) => ROLE_WORDS[role].includes(names[i]));
	for (const role of roles) {
		const phrases = ROLE_WORDS[role].filter((word) => word.length > 1);
		pick(role, (i) => phrases.some((word) => ` ${names[i]} `.includes(` ${word} `)));
	}
	const sample = loaded.data.slice(0, SAMPLE_ROW_COUNT);
	const every = (i: number, test: (cell: SheetCell) => boolean) => {
		const cells = sample.map((row) => row.cells[i] ?? BLANK).filter((c) => c.kind !== 'blank');
		return cells.length > 0 && cells.every(test);
	};
	pick('date', (i) => every(i, (cell) => readDate(cell).ok));
	pick('amount', (i) => every(i, (cell) => readAmount(cell, false).ok));
	return suggested;
}
