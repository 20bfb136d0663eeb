import { eq } from 'drizzle-orm';
import type { RedFlag, Site, SiteMeasure } from '../../domain';
import type {
	AssessmentPoint,
	ClearanceLevels,
	ClearanceModifications
} from '$lib/clearance/types';
import type { Transaction } from '../db';
import {
	assessments,
	clearances,
	clients,
	consentEvents,
	consents,
	referralEvents,
	referrals,
	referralSnapshots,
	screenings
} from '../db/schema';
import { buildScreeningRecord, type ClientDates } from '../clients/screening-record';
import { generateReferralLetter } from '../referrals/letter';
import { snapshotClient, snapshotScreenings } from '../referrals/snapshot';

// Demo clearances at Linden Row Studio, set by physio@clinic.example (Fernbank Pelvic
// Health). Every person, measurement and decision here is invented:
//   Noor Abernethy   — assessed; a current clearance with changes, review in four weeks;
//   Freya Castellan  — assessed; her clearance's review date passed ten days ago;
//   Signe Marlow     — pregnant, dizziness at her last screening: see doctor first;
//   (Maya Okonjo, accepted but not yet assessed, shows the provisional limits — ./referrals.ts.)

const DAY_MS = 86_400_000;
const WEEK_MS = 7 * DAY_MS;
const day = (ms: number) => new Date(ms).toISOString().slice(0, 10);
const morning = (ms: number) => new Date(`${day(ms)}T10:00:00Z`);

type Widths = [number, number, number];

interface DemoCase {
	name: string;
	birthYear: number;
	stage: 'pregnant' | 'postpartum';
	/** Weeks since the birth, or of gestation, today. */
	weeksToday: number;
	screenings: Array<{ week: number; widths: Widths; soft?: boolean; redFlags?: RedFlag[] }>;
	clearance?: {
		setWeeksAgo: number;
		reviewInDays: number;
		levels: ClearanceLevels;
		modifications: ClearanceModifications;
		notes: string;
		points: AssessmentPoint[];
		plan: string;
	};
}

const ALL_CLEARED: ClearanceLevels = {
	loaded_flexion: 'cleared',
	long_lever: 'cleared',
	front_loaded: 'cleared',
	loaded_rotation: 'cleared',
	loaded_extension: 'cleared',
	inversion: 'cleared',
	high_pressure: 'cleared',
	impact: 'cleared',
	deep_stability: 'cleared'
};

const point = (
	position: AssessmentPoint['position'],
	distanceCm: number | null,
	restMm: number,
	curlUpMm: number
): AssessmentPoint => ({
	position,
	distanceCm,
	restMm,
	curlUpMm,
	method: 'ultrasound',
	depth: null,
	tension: null,
	doming: null
});

const cases: DemoCase[] = [
	{
		name: 'Noor Abernethy',
		birthYear: 1993,
		stage: 'postpartum',
		weeksToday: 22,
		screenings: [
			{ week: 8, widths: [2.5, 3, 2], soft: true },
			{ week: 14, widths: [2, 2.5, 1.5] }
		],
		clearance: {
			setWeeksAgo: 4,
			reviewInDays: 28,
			levels: {
				...ALL_CLEARED,
				loaded_flexion: 'hold',
				long_lever: 'modify',
				front_loaded: 'modify',
				impact: 'hold'
			},
			modifications: {
				long_lever: 'Keep one foot down; lower the legs only as far as the back stays heavy.',
				front_loaded: 'Plank from the knees, or forearms on a bench; five slow breaths, then rest.'
			},
			notes: 'Breathe out on the effort. Stop and rest if the belly domes.',
			points: [point('above', 3, 21, 17), point('at', 0, 26, 22), point('below', 3, 12, 10)],
			plan: 'Deep-core and breath retraining at home; progress load in class as written.'
		}
	},
	{
		name: 'Freya Castellan',
		birthYear: 1988,
		stage: 'postpartum',
		weeksToday: 34,
		screenings: [
			{ week: 9, widths: [2.5, 3, 2] },
			{ week: 18, widths: [2, 2, 1.5] }
		],
		clearance: {
			setWeeksAgo: 14,
			reviewInDays: -10,
			levels: { ...ALL_CLEARED, loaded_flexion: 'modify', impact: 'hold' },
			modifications: {
				loaded_flexion: 'Small curl-ups with the head supported, ten at most, no doming.'
			},
			notes: 'Impact waits until the review.',
			points: [point('above', 3, 19, 15), point('at', 0, 23, 18)],
			plan: 'Review in ten weeks with a repeat scan.'
		}
	},
	{
		name: 'Signe Marlow',
		birthYear: 1995,
		stage: 'pregnant',
		weeksToday: 29,
		screenings: [
			{ week: 24, widths: [1.5, 2, 1] },
			{ week: 29, widths: [2, 2.5, 1.5], redFlags: ['dizziness'] }
		]
	}
];

export async function seedDemoClearances(
	tx: Transaction,
	orgIds: { studio: string; clinic: string },
	userIdsByEmail: Record<string, string>
): Promise<void> {
	const instructor = userIdsByEmail['instructor@studio.example'] ?? null;
	const physio = userIdsByEmail['physio@clinic.example'] ?? null;
	const now = Date.now();
	for (const demo of cases) {
		const dayZero = now - demo.weeksToday * WEEK_MS - 2 * DAY_MS;
		const dates: ClientDates = {
			stage: demo.stage,
			dueDate: demo.stage === 'pregnant' ? day(dayZero + 40 * WEEK_MS) : null,
			birthDate: demo.stage === 'postpartum' ? day(dayZero) : null,
			postnatalCheckOn: demo.stage === 'postpartum' ? day(dayZero + 6 * WEEK_MS) : null
		};
		const firstWeek = demo.screenings[0]!.week;
		const [client] = await tx
			.insert(clients)
			.values({
				organisationId: orgIds.studio,
				name: demo.name,
				birthYear: demo.birthYear,
				stage: demo.stage,
				dueDate: dates.dueDate,
				birthDate: dates.birthDate,
				delivery: demo.stage === 'postpartum' ? 'vaginal' : null,
				births: demo.stage === 'postpartum' ? 1 : null,
				multiples: demo.stage === 'postpartum' ? false : null,
				postnatalCheckOn: dates.postnatalCheckOn,
				postnatalCleared: demo.stage === 'postpartum' ? true : null,
				intakeConsentAt: morning(dayZero + firstWeek * WEEK_MS - DAY_MS),
				intakeConsentMethod: 'signed_form',
				intakeConsentTakenBy: instructor,
				createdBy: instructor,
				createdAt: new Date(dayZero + firstWeek * WEEK_MS - DAY_MS)
			})
			.returning();
		let last: { takenAt: Date; outcome: 'within_limit' | 'monitor' | 'refer' } | null = null;
		for (const s of demo.screenings) {
			const takenAt = morning(Math.min(dayZero + s.week * WEEK_MS, now - DAY_MS));
			const sites = Object.fromEntries(
				(['above_navel', 'at_navel', 'below_navel'] as const).map((site, i) => [
					site,
					{
						widthFingers: s.widths[i]!,
						depth: 'moderate',
						tension: s.soft ? 'soft' : 'firm',
						doming: false
					} satisfies SiteMeasure
				])
			) as Record<Site, SiteMeasure>;
			const record = buildScreeningRecord(dates, { takenAt, sites, redFlags: s.redFlags ?? [] });
			await tx
				.insert(screenings)
				.values({ clientId: client!.id, recordedBy: instructor, ...record, createdAt: takenAt });
			last = { takenAt, outcome: record.outcome };
		}
		if (last) {
			await tx
				.update(clients)
				.set({ lastScreenedAt: last.takenAt, lastOutcome: last.outcome })
				.where(eq(clients.id, client!.id));
		}
		if (!demo.clearance) continue;
		const c = demo.clearance;
		const setAt = new Date(now - c.setWeeksAgo * WEEK_MS);
		const sentAt = new Date(setAt.getTime() - 10 * DAY_MS);
		const [grant] = await tx
			.insert(consents)
			.values({
				clientId: client!.id,
				studioId: orgIds.studio,
				clinicId: orgIds.clinic,
				scopes: ['referral', 'screenings', 'clearance', 'documents'],
				startsAt: new Date(sentAt.getTime() - DAY_MS),
				givenBy: null
			})
			.returning({ id: consents.id });
		await tx.insert(consentEvents).values({
			consentId: grant!.id,
			kind: 'given',
			at: new Date(sentAt.getTime() - DAY_MS)
		});
		const [referral] = await tx
			.insert(referrals)
			.values({
				clientId: client!.id,
				studioId: orgIds.studio,
				clinicId: orgIds.clinic,
				physioId: physio,
				createdBy: instructor,
				reason: 'Gap of two finger widths or more at the navel; asking for an assessment.',
				urgency: 'routine',
				redFlags: [],
				state: 'assessed',
				createdAt: new Date(sentAt.getTime() - DAY_MS),
				sentAt,
				updatedAt: setAt,
				consentId: grant!.id
			})
			.returning({ id: referrals.id });
		const referralId = referral!.id;
		const history = await tx.select().from(screenings).where(eq(screenings.clientId, client!.id));
		await tx.insert(referralSnapshots).values({
			referralId,
			takenAt: sentAt,
			client: snapshotClient(client!),
			screenings: snapshotScreenings(history.filter((s) => s.takenAt <= sentAt))
		});
		const steps = [
			{ from: null, to: 'draft', at: new Date(sentAt.getTime() - DAY_MS), by: instructor },
			{ from: 'draft', to: 'sent', at: sentAt, by: instructor },
			{ from: 'sent', to: 'accepted', at: new Date(sentAt.getTime() + DAY_MS), by: physio },
			{ from: 'accepted', to: 'assessed', at: setAt, by: physio }
		] as const;
		for (const step of steps) {
			await tx.insert(referralEvents).values({
				referralId,
				fromState: step.from,
				toState: step.to,
				at: step.at,
				actorUserId: step.by,
				actorRole: step.by === physio ? 'physiotherapist' : 'instructor'
			});
		}
		await generateReferralLetter(tx, referralId);
		await tx.insert(assessments).values({
			referralId,
			clientId: client!.id,
			clinicId: orgIds.clinic,
			points: c.points,
			hernia: 'none',
			pelvicFloor: 'Good voluntary contraction and relaxation; no heaviness reported.',
			plan: c.plan,
			recordedBy: physio,
			recordedAt: setAt
		});
		await tx.insert(clearances).values({
			clientId: client!.id,
			clinicId: orgIds.clinic,
			referralId,
			levels: c.levels,
			modifications: c.modifications,
			notes: c.notes,
			reviewOn: day(now + c.reviewInDays * DAY_MS),
			setBy: physio,
			setAt,
			stageAtSet: demo.stage,
			knownUntil: setAt,
			// Old enough that no reminder is owed on a fresh demo.
			reminderSentAt: c.reviewInDays <= 7 ? setAt : null
		});
	}
}
