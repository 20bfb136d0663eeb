const MS_PER_DAY = 86_400_000;
const DAYS_PER_WEEK = 7;
/** A due date sits at 40 weeks + 0 days of gestation by convention. */
export const GESTATION_WEEKS_AT_DUE_DATE = 40;

export type DateInput = Date | string;

/**
 * The UTC calendar day of a date, counted from 1970-01-01. Dates compare as calendar days so a
 * birth at 23:00 and a screening at 09:00 a week later are one week apart, not six days.
 */
function utcDayNumber(value: DateInput, name: string): number {
	const date = typeof value === 'string' ? new Date(value) : value;
	const ms = date.getTime();
	if (Number.isNaN(ms)) throw new RangeError(`${name} is not a valid date`);
	return Math.floor(ms / MS_PER_DAY);
}

/** Completed weeks since the birth on the given day (0 during the first week). */
export function weeksPostpartum(birthDate: DateInput, on: DateInput): number {
	const days = utcDayNumber(on, 'on') - utcDayNumber(birthDate, 'birthDate');
	if (days < 0) throw new RangeError('The date is before the birth');
	return Math.floor(days / DAYS_PER_WEEK);
}

/** Completed weeks of gestation on the given day, counting 40 weeks at the due date. */
export function weeksOfGestation(dueDate: DateInput, on: DateInput): number {
	const daysToDue = utcDayNumber(dueDate, 'dueDate') - utcDayNumber(on, 'on');
	const gestationDays = GESTATION_WEEKS_AT_DUE_DATE * DAYS_PER_WEEK - daysToDue;
	if (gestationDays < 0) throw new RangeError('The date is more than 40 weeks before the due date');
	return Math.floor(gestationDays / DAYS_PER_WEEK);
}
