// The public page of one certificate: who, what, when, issuer, and whether it is valid, tampered or revoked.
import { error } from '@sveltejs/kit';
import { verifyById } from '$lib/server/credentials/verify';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	const result = await verifyById(params.id);
	if (!result) error(404, { message: 'No certificate with that address was issued by this school.' });
	return { result };
};
