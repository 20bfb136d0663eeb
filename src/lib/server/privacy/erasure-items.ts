import { eq } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { daysUntilDue, isErasureOverdue } from '../../domain/erasure';
import { db, type Executor } from '../db';
import { clients, erasureRequests, organisations, users } from '../db/schema';

export type ErasureState = 'open' | 'approved' | 'declined';

export interface ErasureRequestItem {
	id: string;
	state: ErasureState;
	requestedAt: string;
	dueOn: string;
	/** Days left to answer (negative once overdue); null once answered. */
	daysLeft: number | null;
	overdue: boolean;
	decidedAt: string | null;
	decidedByName: string | null;
	reason: string | null;
	studio: { id: string; name: string };
	/** Null once erased: the request no longer names her. */
	client: { id: string; name: string } | null;
	/** After approval, how many rows of each kind went (or stay with the clinic). */
	erased: Record<string, number> | null;
}

/** What approving would erase and what the clinic would keep: counts, for the admin to read. */
export interface ErasurePreview {
	erased: Array<{ what: string; count: number }>;
	keptByClinics: Array<{ clinic: string; referrals: number; documents: number }>;
	signInErased: boolean;
}

// The request as both sides read it, and the one query that selects it.

const decider = alias(users, 'decider');
const columns = {
	request: erasureRequests,
	studioName: organisations.name,
	clientName: clients.name,
	decidedByName: decider.name
};

export function toItem(
	row: {
		request: typeof erasureRequests.$inferSelect;
		studioName: string;
		clientName: string | null;
		decidedByName: string | null;
	},
	now: Date
): ErasureRequestItem {
	const r = row.request;
	const open = r.state === 'open';
	return {
		id: r.id,
		state: r.state,
		requestedAt: r.requestedAt.toISOString(),
		dueOn: r.dueOn,
		daysLeft: open ? daysUntilDue(r.dueOn, now) : null,
		overdue: open && isErasureOverdue(r.dueOn, now),
		decidedAt: r.decidedAt?.toISOString() ?? null,
		decidedByName: row.decidedByName,
		reason: r.reason,
		studio: { id: r.organisationId, name: row.studioName },
		client: r.clientId && row.clientName ? { id: r.clientId, name: row.clientName } : null,
		erased: r.erased ? (JSON.parse(r.erased) as Record<string, number>) : null
	};
}

export const selectItems = (executor: Executor = db()) =>
	executor
		.select(columns)
		.from(erasureRequests)
		.innerJoin(organisations, eq(organisations.id, erasureRequests.organisationId))
		.leftJoin(clients, eq(clients.id, erasureRequests.clientId))
		.leftJoin(decider, eq(decider.id, erasureRequests.decidedBy));
