// The safety topics a lesson may name: shared by the Safety note widget and the check of the course files.

export const SAFETY_TOPICS = [
	'general',
	'stands',
	'tall-stands',
	'wind',
	'rain',
	'thunder',
	'eyes',
	'flashing',
	'heat',
	'batteries',
	'heights',
	'water'
] as const;
export type SafetyTopic = (typeof SAFETY_TOPICS)[number];

export function isSafetyTopic(value: string): value is SafetyTopic {
	return (SAFETY_TOPICS as readonly string[]).includes(value);
}
