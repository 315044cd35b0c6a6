/**
 * Pincer's numerical core: pure functions, no I/O. Rates are decided in decimal (see decimal.ts);
 * float64 is used only to find candidate brackets.
 */
export { solve } from './solve';
export { npv, datedNpv, type DatedFlow } from './npv';
export { mirr } from './mirr';
export { toleranceCheck, regularity, type ToleranceCheck, type LoanSchedule } from './tolerance';
export { appendixJSchedule, countUnitPeriods } from './appendix-j';
export { unitPeriodOf, describeUnit } from './unit-period';
export type { UnitPeriod } from './unit-period';
export { PRECISION } from './decimal';
