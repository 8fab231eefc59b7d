// The mentor's review forms: a pin, removing a pin, and the critique with rubric and verdict (superforms + zod, both sides).
import { z } from 'zod';

const percent = (words: string) => z.number({ error: 'Place the pin on the photo.' }).min(0, words).max(100, words);

export const pinSchema = z.object({
	frame: z.string().min(1).max(40),
	/** where across and down the frame, in percent of its width and height */
	across: percent('Place the pin on the photo.').default(50),
	down: percent('Place the pin on the photo.').default(50),
	text: z.string().trim().min(1, 'Write what the pin should say.').max(1000, 'Keep a pin under 1000 characters; put the rest in the critique.'),
	/** made once per pin: a double click sends the same key twice and the server keeps one pin */
	key: z.string().regex(/^[A-Za-z0-9-]{8,64}$/, 'Reload the page and place the pin again.')
});
export type PinForm = z.infer<typeof pinSchema>;

export const unpinSchema = z.object({ pin: z.number().int().positive('Choose a pin to remove.') });

export const REVIEW_VERDICTS = ['keep', 'pass', 'fail', 'needs-review'] as const;

export const reviewSchema = z.object({
	text: z.string().trim().min(1, 'Write the critique before sending it.').max(10_000, 'The critique is over 10000 characters; please shorten it.'),
	/** rubric item id → score 1–4; unscored items are absent */
	rubric: z.record(z.string().max(40), z.number().int().min(1).max(4)).default({}),
	verdict: z.enum(REVIEW_VERDICTS, 'Choose a verdict from the list.').default('keep'),
	reason: z.string().trim().max(2000, 'Keep the reason under 2000 characters.').default('')
});
export type ReviewForm = z.infer<typeof reviewSchema>;

/** A superforms message: the text and whether it reports success. */
export type Notice = { text: string; ok: boolean };
