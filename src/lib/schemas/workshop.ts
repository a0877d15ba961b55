import { z } from 'zod';
import { email } from './account';

export const roles = ['owner', 'editor', 'viewer'] as const;
const roleField = (field: string, allowed: readonly string[]) =>
	z.enum(allowed as [string, ...string[]], { error: `${field}: one of ${allowed.join(', ')}` });

export const invite = z.object({
	email,
	// Ownership is given by changing a member's role, not by invitation.
	role: roleField('role', ['editor', 'viewer']),
	/** Sent from a build's page: into that build's workshop, whichever one the user works in, logged on the build. */
	workshopId: z.uuid({ error: 'workshopId: a workshop id' }).optional(),
	buildId: z.uuid({ error: 'buildId: a build id' }).optional()
});

export const memberRole = z.object({
	userId: z.uuid({ error: 'userId: a member id' }),
	role: roleField('role', roles)
});

export const memberId = z.object({ userId: z.uuid({ error: 'userId: a member id' }) });

export const workshopId = z.object({ workshopId: z.uuid({ error: 'workshopId: a workshop id' }) });

export const invitationId = z.object({ invitationId: z.uuid({ error: 'invitationId: an invitation id' }) });
