import { eq } from 'drizzle-orm';
import type { Site, SiteMeasure, RedFlag } from '../../domain';
import type { Transaction } from '../db';
import { clients, screenings } from '../db/schema';
import { buildScreeningRecord, type ClientDates } from '../clients/screening-record';
import type { DemoOrganisationKey } from './scenario';

// Demo client records with screening histories of different shapes: healing, steady,
// widening, pregnant, a red flag, one never screened, one overdue, and one in the other
// studio. Every name and measurement is invented. Dates count back from today, so the demo
// stays current whenever it is loaded.

const DAY_MS = 86_400_000;
const WEEK_MS = 7 * DAY_MS;

type Widths = [above: number, at: number, below: number];

interface DemoScreening {
	/** Weeks after the birth (postpartum) or weeks of gestation (pregnant). */
	week: number;
	widths: Widths;
	feel?: Partial<Record<Site, Partial<SiteMeasure>>>;
	redFlags?: RedFlag[];
	notes?: string;
}

interface DemoClient {
	organisation: DemoOrganisationKey;
	name: string;
	email?: string;
	birthYear: number;
	/** Postpartum: weeks since the birth today; pregnant: weeks of gestation today. */
	weeksToday: number;
	stage: 'pregnant' | 'postpartum';
	delivery?: 'vaginal' | 'caesarean';
	births?: number;
	postnatalCheckWeek?: number;
	postnatalCleared?: boolean;
	consent: boolean;
	notes?: string;
	screenings: DemoScreening[];
}

const demoClients: DemoClient[] = [
	{
		organisation: 'studio',
		name: 'Hana Lindqvist',
		email: 'client@client.example',
		birthYear: 1991,
		stage: 'postpartum',
		weeksToday: 20,
		delivery: 'vaginal',
		births: 1,
		postnatalCheckWeek: 7,
		postnatalCleared: true,
		consent: true,
		notes: 'Mat classes twice a week. Likes breath work.',
		screenings: [
			{ week: 7, widths: [2.5, 3, 1.5], feel: { at_navel: { depth: 'moderate' } } },
			{ week: 10, widths: [2, 2.5, 1.5] },
			{ week: 13, widths: [1.5, 2, 1] },
			{ week: 16, widths: [1.5, 1.5, 1] },
			{ week: 19, widths: [1, 1.5, 1], notes: 'Much firmer midline on the curl-up.' }
		]
	},
	{
		organisation: 'studio',
		name: 'Bea Sorensen',
		email: 'client2@client.example',
		birthYear: 1988,
		stage: 'postpartum',
		weeksToday: 14,
		delivery: 'caesarean',
		births: 2,
		postnatalCheckWeek: 6,
		postnatalCleared: true,
		consent: true,
		screenings: [
			{ week: 8, widths: [2, 2.5, 1.5] },
			{ week: 10, widths: [2, 2.5, 1.5] },
			{ week: 12, widths: [2, 2, 1.5], feel: { at_navel: { tension: 'soft' } } }
		]
	},
	{
		organisation: 'studio',
		name: 'Clara Nwosu',
		birthYear: 1993,
		stage: 'postpartum',
		weeksToday: 26,
		delivery: 'vaginal',
		births: 1,
		postnatalCheckWeek: 8,
		postnatalCleared: true,
		consent: true,
		notes: 'Back to running on her own; asked about crunches.',
		screenings: [
			{ week: 12, widths: [1, 1.5, 1] },
			{ week: 16, widths: [1.5, 2, 1] },
			{ week: 20, widths: [1.5, 2.5, 1] },
			{ week: 24, widths: [2, 3, 1.5], feel: { at_navel: { doming: true, depth: 'deep' } } }
		]
	},
	{
		organisation: 'studio',
		name: 'Ines Farrow',
		email: 'ines.farrow@client.example',
		birthYear: 1995,
		stage: 'pregnant',
		weeksToday: 30,
		consent: true,
		screenings: [
			{ week: 24, widths: [1.5, 2, 1] },
			{ week: 28, widths: [2, 3, 1.5] }
		]
	},
	{
		organisation: 'studio',
		name: 'Maya Okonjo',
		birthYear: 1990,
		stage: 'postpartum',
		weeksToday: 10,
		delivery: 'vaginal',
		births: 3,
		postnatalCheckWeek: 6,
		postnatalCleared: true,
		consent: true,
		screenings: [
			{
				week: 9,
				widths: [1, 1.5, 1],
				redFlags: ['pelvic_heaviness', 'leakage'],
				notes: 'Heaviness by the end of the class; leaks when she jumps.'
			}
		]
	},
	{
		organisation: 'studio',
		name: 'Rosa Delgado',
		birthYear: 1997,
		stage: 'postpartum',
		weeksToday: 4,
		delivery: 'caesarean',
		births: 1,
		consent: false,
		notes: 'Joining after her postnatal check.',
		screenings: []
	},
	{
		organisation: 'studio',
		name: 'Lena Haddad',
		birthYear: 1986,
		stage: 'postpartum',
		weeksToday: 30,
		delivery: 'vaginal',
		births: 2,
		postnatalCheckWeek: 6,
		postnatalCleared: true,
		consent: true,
		screenings: [
			{ week: 10, widths: [1.5, 2, 1] },
			{ week: 19, widths: [1, 1.5, 1] }
		]
	},
	{
		organisation: 'otherStudio',
		name: 'Ottilie Brandvold',
		birthYear: 1992,
		stage: 'postpartum',
		weeksToday: 16,
		delivery: 'vaginal',
		births: 1,
		postnatalCheckWeek: 7,
		postnatalCleared: true,
		consent: true,
		screenings: [
			{ week: 8, widths: [2, 2.5, 1.5] },
			{ week: 14, widths: [1.5, 2, 1] }
		]
	}
];

const dayString = (ms: number) => new Date(ms).toISOString().slice(0, 10);
/** Ten in the morning, UTC, on the given day. */
const morningOf = (ms: number) => new Date(`${dayString(ms)}T10:00:00Z`);

export async function seedDemoClients(
	tx: Transaction,
	orgIds: Record<DemoOrganisationKey, string>,
	userIdsByEmail: Record<string, string>
): Promise<void> {
	const now = Date.now();
	const instructorFor: Record<string, string | undefined> = {
		studio: userIdsByEmail['instructor@studio.example'],
		otherStudio: userIdsByEmail['instructor@otherstudio.example']
	};
	for (const demo of demoClients) {
		// Day 0: the birth, or for a pregnancy the start of gestation (due date 40 weeks on).
		const dayZero = now - demo.weeksToday * WEEK_MS - 2 * DAY_MS;
		const dates: ClientDates = {
			stage: demo.stage,
			dueDate: demo.stage === 'pregnant' ? dayString(dayZero + 40 * WEEK_MS) : null,
			birthDate: demo.stage === 'postpartum' ? dayString(dayZero) : null,
			postnatalCheckOn:
				demo.postnatalCheckWeek === undefined
					? null
					: dayString(dayZero + demo.postnatalCheckWeek * WEEK_MS)
		};
		const instructor = instructorFor[demo.organisation] ?? null;
		const firstWeek = demo.screenings[0]?.week ?? demo.weeksToday;
		const [row] = await tx
			.insert(clients)
			.values({
				organisationId: orgIds[demo.organisation],
				userId: demo.email ? (userIdsByEmail[demo.email] ?? null) : null,
				name: demo.name,
				email: demo.email ?? null,
				birthYear: demo.birthYear,
				stage: demo.stage,
				dueDate: dates.dueDate,
				birthDate: dates.birthDate,
				delivery: demo.delivery ?? null,
				births: demo.births ?? null,
				multiples: demo.stage === 'postpartum' ? false : null,
				postnatalCheckOn: dates.postnatalCheckOn,
				postnatalCleared: demo.postnatalCleared ?? null,
				notes: demo.notes ?? null,
				intakeConsentAt: demo.consent ? morningOf(dayZero + (firstWeek * WEEK_MS - DAY_MS)) : null,
				intakeConsentMethod: demo.consent ? 'signed_form' : null,
				intakeConsentTakenBy: demo.consent ? instructor : null,
				createdBy: instructor,
				createdAt: new Date(dayZero + (firstWeek * WEEK_MS - DAY_MS))
			})
			.returning({ id: clients.id });
		const clientId = row!.id;

		let last: { takenAt: Date; outcome: 'within_limit' | 'monitor' | 'refer' } | null = null;
		for (const s of demo.screenings) {
			const takenAt = morningOf(dayZero + s.week * WEEK_MS);
			const sites = Object.fromEntries(
				(['above_navel', 'at_navel', 'below_navel'] as const).map((site, i) => [
					site,
					{
						widthFingers: s.widths[i]!,
						depth: 'shallow',
						tension: 'firm',
						doming: false,
						...s.feel?.[site]
					} satisfies SiteMeasure
				])
			) as Record<Site, SiteMeasure>;
			const record = buildScreeningRecord(dates, {
				takenAt,
				sites,
				redFlags: s.redFlags ?? [],
				notes: s.notes ?? null
			});
			await tx.insert(screenings).values({ clientId, recordedBy: instructor, ...record });
			last = { takenAt, outcome: record.outcome };
		}
		if (last) {
			await tx
				.update(clients)
				.set({ lastScreenedAt: last.takenAt, lastOutcome: last.outcome })
				.where(eq(clients.id, clientId));
		}
	}
}
