// Decides what a typed card number does: the documented test numbers succeed or decline, anything else is refused.

/** @typedef {{ ok: true, brand: string, last4: string } | { ok: false, code: string, declineCode?: string, message: string }} CardOutcome */

const DECLINED = 'Your card was declined.';

/**
 * Test numbers as the provider's testing docs list them (quoted from memory; 4242… and 4000…0002 are the ones
 * the product relies on, the others are extra decline reasons).
 * @type {Map<string, { brand: string } | { code: string, declineCode?: string, message: string }>}
 */
const TEST_CARDS = new Map([
	['4242424242424242', { brand: 'visa' }],
	['5555555555554444', { brand: 'mastercard' }],
	['4000000000000002', { code: 'card_declined', declineCode: 'generic_decline', message: DECLINED }],
	['4000000000009995', { code: 'card_declined', declineCode: 'insufficient_funds', message: 'Your card has insufficient funds.' }],
	['4000000000000069', { code: 'expired_card', message: 'Your card has expired.' }]
]);

/**
 * @param {string} typed what was in the card number field, spaces and dashes allowed
 * @returns {CardOutcome}
 */
export function chargeCard(typed) {
	const digits = typed.replace(/[\s-]/g, '');
	if (digits === '') return { ok: false, code: 'incomplete_number', message: 'Your card number is incomplete.' };
	if (!/^\d{12,19}$/.test(digits) || !passesLuhn(digits)) {
		return { ok: false, code: 'invalid_number', message: 'Your card number is invalid.' };
	}
	const card = TEST_CARDS.get(digits);
	if (!card) {
		return { ok: false, code: 'card_declined', declineCode: 'test_mode_live_card', message: `${DECLINED} This is a test payment page: use a test card number.` };
	}
	if ('brand' in card) return { ok: true, brand: card.brand, last4: digits.slice(-4) };
	return { ok: false, ...card };
}

/** @param {string} digits */
function passesLuhn(digits) {
	let sum = 0;
	for (let i = 0; i < digits.length; i++) {
		let d = Number(digits[digits.length - 1 - i]);
		if (i % 2 === 1) {
			d *= 2;
			if (d > 9) d -= 9;
		}
		sum += d;
	}
	return sum % 10 === 0;
}
