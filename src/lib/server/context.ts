import type { AccessContext } from './audit';
import type { Actor } from './actor';

/**
 * What every service function receives first: who is asking (the actor, loaded once per
 * request by hooks.server.ts) and the request's access context for the access log.
 */
export interface Caller {
	actor: Actor;
	access: AccessContext;
}
