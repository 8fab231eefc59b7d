// The fake's own payment page: GET shows the amount and a card field; POST pays (test cards) or cancels.
import { chargeCard } from './cards.mjs';
import { completeSession, successRedirect } from './checkout.mjs';
import { formatAmount } from './money.mjs';
import { readBody, redirect, sendHtml } from './http.mjs';

const STYLE = `
body { font: 16px/1.5 system-ui, sans-serif; color: #222; background: #f4f4f4; margin: 0; }
main { max-width: 26rem; margin: 3rem auto; background: #fff; border: 1px solid #ccc; border-radius: 6px; padding: 1.5rem; }
.note { font-size: 0.85rem; color: #555; margin-top: 0; }
h1 { font-size: 1.6rem; margin: 0.25rem 0 1rem; }
ul { padding-left: 1.2rem; }
label { display: block; font-weight: 600; margin-top: 1rem; }
input { width: 100%; box-sizing: border-box; font: inherit; padding: 0.5rem; border: 1px solid #888; border-radius: 4px; }
.help { font-size: 0.85rem; color: #555; }
.error { color: #a00; border: 1px solid #a00; background: #fff4f4; padding: 0.5rem; border-radius: 4px; }
.actions { display: flex; gap: 0.75rem; margin-top: 1rem; }
button { font: inherit; padding: 0.5rem 1rem; border-radius: 4px; border: 1px solid #555; background: #eee; cursor: pointer; }
button[value="pay"] { background: #333; color: #fff; }
`;

/**
 * @param {import('node:http').IncomingMessage} req
 * @param {import('node:http').ServerResponse} res
 * @param {import('./events.mjs').EventContext} ctx
 * @param {string} sessionId
 */
export async function handlePayPage(req, res, ctx, sessionId) {
	const session = ctx.store.sessions.get(sessionId);
	if (!session) return sendHtml(res, 404, page('Payment not found', '<p>There is no payment session with this address.</p>'));
	if (session.status === 'expired') return sendHtml(res, 410, page('Payment closed', '<p>This payment session has expired; nothing was charged. Go back to the shop to start again.</p>'));
	if (req.method === 'GET') {
		if (session.status === 'complete') return sendHtml(res, 200, completePage(session));
		return sendHtml(res, 200, payForm(ctx, session, { card: '', error: null }));
	}
	if (req.method !== 'POST') return sendHtml(res, 405, page('Not allowed', '<p>Use the form on this page.</p>'));

	const form = new URLSearchParams(await readBody(req));
	const action = form.get('action');
	if (action === 'cancel') {
		if (session.status === 'complete') return sendHtml(res, 409, completePage(session));
		if (!session.cancel_url) return sendHtml(res, 400, payForm(ctx, session, { card: '', error: 'This payment has no cancel address; close the page to leave.' }));
		return redirect(res, session.cancel_url);
	}
	if (action !== 'pay') return sendHtml(res, 400, payForm(ctx, session, { card: '', error: 'Choose Pay or Cancel.' }));
	// a second Pay (double click, back button) charges nothing more and goes where the first one went
	if (session.status === 'complete') return redirect(res, successRedirect(session));
	const card = form.get('card') ?? '';
	const outcome = chargeCard(card);
	if (!outcome.ok) return sendHtml(res, 402, payForm(ctx, session, { card, error: outcome.message }));
	completeSession(ctx, session, outcome);
	return redirect(res, successRedirect(session));
}

/**
 * @param {import('./events.mjs').EventContext} ctx
 * @param {Record<string, any>} session
 * @param {{ card: string, error: string | null }} state
 */
function payForm(ctx, session, state) {
	const total = formatAmount(session.amount_total, session.currency);
	const items = (ctx.store.lineItems.get(session.id) ?? [])
		.map((item) => `<li>${escapeHtml(item.description)} × ${item.quantity}: ${escapeHtml(formatAmount(item.amount_total, item.currency))}</li>`)
		.join('');
	const error = state.error ? `<p class="error" role="alert" id="card-error">${escapeHtml(state.error)}</p>` : '';
	const described = state.error ? 'card-help card-error' : 'card-help';
	const email = session.customer_email ? `<p>Receipt to ${escapeHtml(session.customer_email)}</p>` : '';
	const cancel = session.cancel_url ? '<button type="submit" name="action" value="cancel">Cancel</button>' : '';
	return page(
		`Pay ${total}`,
		`<h1>Pay ${escapeHtml(total)}</h1>
<ul>${items}</ul>
${email}
<form method="post">
${error}
<label for="card">Card number</label>
<input id="card" name="card" inputmode="numeric" autocomplete="cc-number" value="${escapeHtml(state.card)}" aria-describedby="${described}"${state.error ? ' aria-invalid="true"' : ''}>
<p class="help" id="card-help">Test cards: 4242 4242 4242 4242 pays; 4000 0000 0000 0002 is declined.</p>
<div class="actions">
<button type="submit" name="action" value="pay">Pay ${escapeHtml(total)}</button>
${cancel}
</div>
</form>`
	);
}

/** @param {Record<string, any>} session */
function completePage(session) {
	const total = formatAmount(session.amount_total, session.currency);
	return page('Payment complete', `<h1>Paid ${escapeHtml(total)}</h1>
<p>This payment is complete.</p>
<p><a href="${escapeHtml(successRedirect(session))}">Return to the site</a></p>`);
}

/**
 * @param {string} title
 * @param {string} body
 */
function page(title, body) {
	return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)} · test payment</title>
<style>${STYLE}</style>
</head>
<body>
<main>
<p class="note">Local test payment page: no real card is charged.</p>
${body}
</main>
</body>
</html>
`;
}

/** @param {string} text */
export function escapeHtml(text) {
	return String(text).replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}
