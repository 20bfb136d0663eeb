import { AsyncLocalStorage } from 'node:async_hooks';
import type { Database, Transaction } from './index';

/**
 * One transaction shared by every service a page load calls (see `readAsOne` in
 * `../page-read.ts`). Inside it `db()` answers `executor`: the transaction itself, whose own
 * `transaction(work)` runs the work in place instead of opening a savepoint, so a service
 * written for its own transaction joins the page's unchanged.
 */
export interface SharedTransaction {
	tx: Transaction;
	executor: Database;
	/** False once the transaction ended: a late straggler then gets the pool, not a dead tx. */
	open: boolean;
	/** Work to run in the transaction just before it commits (the access log's one insert). */
	beforeCommit: Array<() => Promise<void>>;
	/**
	 * Work to run once the transaction has ended, committed or not, on a connection of its own:
	 * refusals. Written meanwhile they would need a second connection while holding the first,
	 * and a burst of refused pages could take the whole pool and wait on each other for ever.
	 */
	afterEnd: Array<() => Promise<void>>;
	/** Reads done once per page (the client's row the services each check), by key. */
	memo: Map<string, Promise<unknown>>;
}

export const sharedTransactions = new AsyncLocalStorage<SharedTransaction>();

/** The shared transaction this code runs in, if any and still open. */
export function sharedTransaction(): SharedTransaction | undefined {
	const shared = sharedTransactions.getStore();
	return shared?.open ? shared : undefined;
}

/**
 * A read that every service of one page load would repeat (the client's row, say), done once
 * in the shared transaction; outside one, simply done.
 */
export function readOnce<T>(key: string, read: () => Promise<T>): Promise<T> {
	const shared = sharedTransaction();
	if (!shared) return read();
	let pending = shared.memo.get(key) as Promise<T> | undefined;
	if (!pending) {
		pending = read();
		shared.memo.set(key, pending);
	}
	return pending;
}
