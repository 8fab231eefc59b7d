// A certificate's files for its holder (or an admin): the signed credential (.jwt), its JSON, the printable PDF.
import { json } from '@sveltejs/kit';
import { checkApiAccess } from '$lib/server/guards';
import { credentialFor } from '$lib/server/credentials/register';
import { credentialJson, decodeStored } from '$lib/server/credentials/verify';
import { certificatePdf } from '$lib/server/credentials/pdf';
import { publicOrigin } from '$lib/server/credentials/issue';
import type { OpenBadgeCredential } from '$lib/server/credentials/document';
import type { RequestHandler } from './$types';

const formats = ['pdf', 'jwt', 'json'] as const;
type Format = (typeof formats)[number];

export const GET: RequestHandler = async ({ locals, params, url }) => {
	const access = checkApiAccess(locals);
	if (!access.ok) return access.response;
	const format = (url.searchParams.get('format') ?? 'jwt') as Format;
	if (!formats.includes(format)) return json({ error: 'bad-format', message: 'Ask for format=pdf, jwt or json.' }, { status: 400 });
	// someone else's certificate and a missing one answer alike
	const row = await credentialFor(access.user, params.id);
	if (!row) return json({ error: 'not-found', message: 'There is no such certificate.' }, { status: 404 });
	const base = `stopwise-certificate-${row.courseSlug}`;
	const headers = (type: string, ext: string) => ({ 'content-type': type, 'content-disposition': `attachment; filename="${base}.${ext}"`, 'cache-control': 'private, no-store' });
	if (format === 'jwt') return new Response(row.jwt, { headers: headers('application/jwt', 'jwt') });
	const document = credentialJson(decodeStored(row.jwt));
	if (format === 'json') return new Response(JSON.stringify(document, null, 2), { headers: headers('application/json', 'json') });
	const pdf = await certificatePdf(document as unknown as OpenBadgeCredential, `${publicOrigin(url.origin)}/verify/credential/${row.id}`);
	return new Response(pdf as Uint8Array<ArrayBuffer>, { headers: headers('application/pdf', 'pdf') });
};
