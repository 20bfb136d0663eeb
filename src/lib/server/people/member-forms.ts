import { z } from 'zod';
import { email } from '../http/schemas';

// One schema per form on the members page.

const role = z.enum(['instructor', 'physiotherapist', 'admin'], { message: 'Choose a role.' });

export const inviteForm = z.object({
	email: z.string().trim().min(1, 'Enter an e-mail address.').pipe(email),
	role
});

export const revokeForm = z.object({ invitationId: z.uuid('Unknown invitation.') });
export const changeRoleForm = z.object({ membershipId: z.uuid('Unknown member.'), role });
export const deactivateForm = z.object({ membershipId: z.uuid('Unknown member.') });
