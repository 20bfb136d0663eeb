import { z } from 'zod';
import {
	consentStatus,
	normaliseScopes,
	type ConsentStatus,
	type ShareScope
} from '../../domain/consent';
import { consents } from '../db/schema';

// Consent to share between a client's studio and one clinic. The client gives and withdraws
// her own grants; her studio's instructors may ask her to; admins read their organisation's.
// Every exported function asserts its rule first; work and its access-log row share one
// transaction; a refusal is logged in its own transaction and then thrown.

export interface ConsentItem {
	id: string;
	clientId: string;
	studioId: string;
	clinicId: string;
	scopes: ShareScope[];
	startsAt: string;
	endsAt: string | null;
	withdrawnAt: string | null;
	status: ConsentStatus;
}

type ConsentRow = typeof consents.$inferSelect;

export function toItem(row: ConsentRow, now: Date): ConsentItem {
	return {
		id: row.id,
		clientId: row.clientId,
		studioId: row.studioId,
		clinicId: row.clinicId,
		scopes: normaliseScopes(row.scopes),
		startsAt: row.startsAt.toISOString(),
		endsAt: row.endsAt?.toISOString() ?? null,
		withdrawnAt: row.withdrawnAt?.toISOString() ?? null,
		status: consentStatus(row, now)
	};
}

export const listCursor = z.object({ t: z.iso.datetime(), id: z.uuid() });

/**
 * Policy: mayListConsents (the client's own grants; an admin's organisation's). Audit:
 * consent.read, one row per grant shown.
 */
