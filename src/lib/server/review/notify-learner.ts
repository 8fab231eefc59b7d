// Tells the learner by e-mail that their attempt has a critique (a failed send is logged, the review stays saved).
import type { AttemptVerdict } from '../db/schema';
import { sendLetter, type SendResult } from '../mail';
import { critiqueLetter } from '../mail-letters';

const VERDICT_WORDS: Record<AttemptVerdict, string> = { pass: 'passed', fail: 'not yet', 'needs-review': 'with a mentor' };

export function verdictWords(verdict: AttemptVerdict | null): string {
	return verdict ? VERDICT_WORDS[verdict] : 'no automatic verdict';
}

export function sendCritiqueMail(
	origin: string,
	attemptId: string,
	facts: { learner: { email: string; name: string }; assignment: string; verdict: AttemptVerdict | null; changed: boolean }
): Promise<SendResult> {
	return sendLetter(
		critiqueLetter(facts.learner.email, facts.learner.name, {
			assignment: facts.assignment,
			verdict: verdictWords(facts.verdict),
			changed: facts.changed,
			href: `${origin}/attempts/${attemptId}`
		})
	);
}
