// The Shoot Plan forms: what a learner files before an Assignment's uploads open, and the mentor's decision (superforms + zod, both sides).
import { z } from 'zod';
import { parseAperture, parseShutter } from '$lib/exposure';

/** What a learner confirms before any shoot that puts lights near athletes; an Assignment's spec may replace the list. */
export const DEFAULT_SHOOT_CHECKLIST = [
	'Every stand is sandbagged or held by a helper, and none stands in the athlete’s line or run-out zone.',
	'The athlete (and a parent or guardian for a minor) agreed to be photographed with flash and knows the cue for a repeat.',
	'No flash fires into a rider’s or climber’s eyes mid-move; the cue is agreed before each repeat.',
	'The venue’s rules allow the lights, and the forecast has no thunder; mains-powered strobes stay out of rain.',
	'Batteries are charged and carried in their cases; the flash rests between bursts.'
] as const;

const readable = (parse: (text: string) => number, words: string) =>
	z
		.string()
		.trim()
		.min(1, words)
		.max(20, words)
		.refine((text) => {
			try {
				parse(text);
				return true;
			} catch {
				return false;
			}
		}, words);

export const shootPlanSchema = z.object({
	/** the Light Plan widget's layout as JSON text; the server checks its shape */
	lightPlan: z.string().max(4000, 'The Light Plan could not be read. Arrange it again.').default(''),
	shutter: readable(parseShutter, 'Write the shutter time like 1/250.'),
	aperture: readable(parseAperture, 'Write the aperture like f/8.'),
	iso: z.number({ error: 'Give the ISO as a number.' }).int('Give the ISO as a whole number.').min(25, 'ISO 25 is the lowest this form takes.').max(409_600, 'That ISO is higher than any camera offers.'),
	flash: z.string().trim().max(300, 'Keep the flash settings under 300 characters.').default(''),
	story: z
		.string()
		.trim()
		.min(20, 'Say in a sentence or two where the athlete runs, where the lights stand and how you cue each repeat.')
		.max(3000, 'Keep the plan under 3000 characters.'),
	/** indexes of the checklist lines the learner ticked */
	checked: z.array(z.number().int().min(0).max(20)).max(21).default([])
});
export type ShootPlanForm = z.infer<typeof shootPlanSchema>;

export const PLAN_DECISIONS = ['approve', 'return'] as const;

export const planDecisionSchema = z
	.object({
		decision: z.enum(PLAN_DECISIONS, 'Choose to approve the plan or send it back.'),
		note: z.string().trim().max(2000, 'Keep the note under 2000 characters.').default(''),
		/** when the plan the mentor read was filed: a learner's revision since then is not decided unread */
		seen: z.string().max(40).default('')
	})
	.refine((d) => d.decision === 'approve' || d.note.length > 0, { path: ['note'], message: 'Say what to change before sending the plan back.' });
export type PlanDecisionForm = z.infer<typeof planDecisionSchema>;
