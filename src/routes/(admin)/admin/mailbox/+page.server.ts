// The demo mailbox: every message the fake SMTP server received (empty when real SMTP is configured).
import { requireRole } from '$lib/server/guards';
import { listMail } from '$lib/server/mailbox';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'admin');
	return { messages: await listMail(), realSmtp: Boolean(process.env.SMTP_HOST) };
};
