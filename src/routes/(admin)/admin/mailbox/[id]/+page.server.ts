// One message from the demo mailbox: headers, text part with clickable links, HTML part in a sandbox.
import { error } from '@sveltejs/kit';
import { requireRole } from '$lib/server/guards';
import { readMail, splitLinks } from '$lib/server/mailbox';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'admin');
	const message = await readMail(event.params.id);
	if (!message) error(404, { message: 'There is no such message in the mailbox.' });
	return { message: { ...message, parts: splitLinks(message.text) } };
};
