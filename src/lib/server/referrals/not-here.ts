import { error } from '@sveltejs/kit';
import { recordRefusal, type AuditAction } from '../audit';
import type { Caller } from '../context';

// Pages and actions whose whole area a person's role does not reach answer the designed 404
// page — and, like every refusal, leave a row in the access log first.

export async function notHere(
	caller: Caller,
	action: AuditAction,
	target: { type: string; id: string }
): Promise<never> {
	await recordRefusal(caller.access, {
		action,
		target: { ...target, id: target.id.slice(0, 200) }
	});
	error(404, 'Not found');
}
