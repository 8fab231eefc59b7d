// Checks that a lesson carries the Safety note topics its frontmatter says it needs.
import type { SafetyTopic } from '../../safety-topics';

// Widgets stand on a line of their own with string attributes (the renderer refuses anything else), so a
// plain scan of the source finds every Safety note a learner will see.
const SAFETY_NOTE = /<SafetyNote\b[^>]*?\btopics\s*=\s*"([^"]*)"/g;

/** The topics named by the Safety notes in a lesson's Markdown source. */
export function safetyTopicsIn(source: string): Set<string> {
	const topics = new Set<string>();
	for (const match of source.matchAll(SAFETY_NOTE)) {
		for (const topic of match[1].split(',')) if (topic.trim()) topics.add(topic.trim());
	}
	return topics;
}

/** The required topics that no Safety note in the source names, in the order they were required. */
export function missingSafetyTopics(required: readonly SafetyTopic[], source: string): SafetyTopic[] {
	const shown = safetyTopicsIn(source);
	return required.filter((topic) => !shown.has(topic));
}

/** Throws naming the file when a required topic is missing (the course files are ours: fail loudly at start-up). */
export function assertSafetyTopics(path: string, required: readonly SafetyTopic[], source: string): void {
	const missing = missingSafetyTopics(required, source);
	if (missing.length === 0) return;
	throw new Error(
		`${path}: its frontmatter says it needs the caution${missing.length > 1 ? 's' : ''} ${missing.join(', ')}, ` +
			`but no <SafetyNote topics="..."> in the lesson names ${missing.length > 1 ? 'them' : 'it'}`
	);
}
