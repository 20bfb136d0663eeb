import type { Exercise } from '../domain/exercises/exercise';
import type { PlanCell } from '../domain/plan-check';

// Session-plan shapes shared by the server, the API and the browser (no server imports).

export interface PlanItem {
	exerciseId: string;
	reps?: string | null;
	notes?: string | null;
	/** clientId → the exercise she does instead. */
	swaps: Record<string, string>;
}

/** Each cell's status at a moment, to say what changed since. */
export interface PlanCheckSnapshot {
	checkedAt: string;
	cells: Array<{
		clientId: string;
		itemIndex: number;
		exerciseId: string;
		status: PlanCell['status'];
	}>;
}

export interface OverriddenCell {
	clientId: string;
	itemIndex: number;
	exerciseId: string;
	categories: string[];
}

export interface PlanClient {
	id: string;
	name: string;
	firstName: string;
	stage: 'pregnant' | 'postpartum';
}

export interface PlanSummary {
	id: string;
	title: string;
	scheduledFor: string | null;
	clientCount: number;
	itemCount: number;
	version: number;
	ready: boolean;
	archived: boolean;
	updatedAt: string;
}

export interface PlanDetail {
	id: string;
	title: string;
	scheduledFor: string | null;
	clientIds: string[];
	clients: PlanClient[];
	items: PlanItem[];
	version: number;
	readyAt: string | null;
	archivedAt: string | null;
	overrides: Array<{ reason: string; cells: OverriddenCell[]; at: string; planVersion: number }>;
	updatedAt: string;
}

export interface PlanCheckChange {
	clientId: string;
	itemIndex: number;
	exerciseId: string;
	was: PlanCell['status'];
	now: PlanCell['status'];
}

export interface PlanCheckResult {
	items: Array<
		PlanCell & {
			/** Covered by the studio's written override (only ever for overridable cells). */
			overridden: boolean;
		}
	>;
	checkedAt: string;
	/** Cells whose status changed since the plan was marked ready (empty when not ready). */
	changes: PlanCheckChange[];
}

export type { Exercise, PlanCell };

/** What a client sees for herself from ready plans: no other client's name, no reasons. */
export interface ForYouEntry {
	planTitle: string;
	scheduledFor: string | null;
	exerciseName: string;
	instead?: string;
	modification?: string;
}
