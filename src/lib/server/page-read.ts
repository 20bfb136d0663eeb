import { ownDb, type Database, type Transaction } from './db';
import { sharedTransaction, sharedTransactions, type SharedTransaction } from './db/scope';

/**
 * Runs a page load's service calls in one transaction. A page such as a client's record calls
 * five services (her record, screenings, referrals, clearance, self-care); each opens its own
 * transaction and logs its own access, about forty statements in all. Inside `readAsOne` they
 * share one transaction, read the client's row once (`readOnce`), and their access-log rows —
 * the same rows, in the same transaction as the reads — go in one insert just before the
 * commit. A refusal still commits on its own, once the shared transaction has ended, so a page
 * that ends in a 404 leaves its record of the refusal and nothing else.
 *
 * For loads only: call the services one after the other (a load that catches a service's
 * error keeps what that service did, as the shared transaction has no savepoints).
 */
export async function readAsOne<T>(work: () => Promise<T>): Promise<T> {
	if (sharedTransaction()) return work();
	const afterEnd: Array<() => Promise<void>> = [];
	try {
		return await ownDb().transaction(async (tx) => {
			const shared: SharedTransaction = {
				tx,
				executor: inPlace(tx, () => shared.open),
				open: true,
				beforeCommit: [],
				afterEnd,
				memo: new Map()
			};
			try {
				const result = await sharedTransactions.run(shared, work);
				for (const step of shared.beforeCommit) await step();
				return result;
			} finally {
				shared.open = false;
			}
		});
	} finally {
		// Refusals, once the page's connection is back in the pool (see SharedTransaction).
		for (const step of afterEnd) await step();
	}
}

/**
 * The transaction as a service sees it: `transaction(work)` runs the work in place (no
 * savepoint), and any use after the page's transaction ended throws — its connection may
 * already serve another request.
 */
function inPlace(tx: Transaction, open: () => boolean): Database {
	const executor: Database = new Proxy(tx as unknown as Database, {
		get(target, property) {
			// Not a promise (awaiting a value that holds it asks for `then`, even afterwards).
			if (property === 'then') return undefined;
			if (!open()) throw new Error('the page’s shared transaction has already ended');
			if (property === 'transaction') {
				return <T>(work: (inner: Database) => Promise<T>) => work(executor);
			}
			const value: unknown = Reflect.get(target, property, target);
			return typeof value === 'function'
				? (value as (...a: unknown[]) => unknown).bind(target)
				: value;
		}
	});
	return executor;
}
