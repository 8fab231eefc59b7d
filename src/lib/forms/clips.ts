// The form that adds a lesson clip: its name (the widget tag's), title and WebVTT captions; checked in the page and by the API.
import { z } from 'zod';
import { checkCaptions, MAX_CAPTION_CHARS } from '../clips/webvtt';

export const clipSchema = z.object({
	lesson: z.number().int().positive(),
	name: z
		.string()
		.trim()
		.toLowerCase()
		.min(1, 'Give the clip a name: the lesson places it with <Clip name="…" />.')
		.max(60, 'Use at most 60 characters.')
		.regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'Use lower-case letters, digits and single hyphens, e.g. stands-at-the-ramp.'),
	title: z.string().trim().min(1, 'Give the clip a title.').max(120, 'Use at most 120 characters.'),
	captions: z
		.string()
		.max(MAX_CAPTION_CHARS, `Captions may be at most ${MAX_CAPTION_CHARS.toLocaleString('en')} characters.`)
		.superRefine((text, ctx) => {
			if (!text.trim()) return void ctx.addIssue({ code: 'custom', message: 'Captions are required: choose a WebVTT file or write them here.' });
			const checked = checkCaptions(text);
			if (!checked.ok) ctx.addIssue({ code: 'custom', message: checked.message });
		})
});
export type ClipInput = z.infer<typeof clipSchema>;
