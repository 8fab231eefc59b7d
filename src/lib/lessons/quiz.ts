// Quiz checking, shared: the browser shows the verdict at once, the server decides what is stored from the same spec.
import { readNumberText, type RawAttr } from '$lib/components/widgets/parts/attrs';
import { formatNumber } from '$lib/format';

/** A checkable question: a number within a tolerance, or one right choice (1-based) among several. */
export type QuizSpec =
	| { kind: 'numeric'; answer: number; tolerance: number; unit: string }
	| { kind: 'choice'; choices: readonly string[]; answer: number };

/** The outcome of one check, with the sentence shown under the question. */
export interface QuizCheck {
	correct: boolean;
	explanation: string;
}

/** Reads the Quiz attributes; a spec that cannot be checked is null, with notices saying why. */
export function readQuizSpec(attrs: { id?: RawAttr; answer?: RawAttr; tolerance?: RawAttr; unit?: RawAttr; choices?: RawAttr }): {
	spec: QuizSpec | null;
	notices: string[];
} {
	const notices: string[] = [];
	if (!attrs.id || !String(attrs.id).trim()) notices.push('id is missing: answers cannot be saved without it.');
	const choices = attrs.choices === undefined ? [] : String(attrs.choices).split('|').map((c) => c.trim()).filter(Boolean);
	const answer = readNumberText(attrs.answer);
	if (attrs.choices !== undefined) {
		if (choices.length < 2) notices.push(`choices="${String(attrs.choices)}" needs at least two options separated by |.`);
		else if (answer === null || !Number.isInteger(answer) || answer < 1 || answer > choices.length) {
			notices.push(`answer="${String(attrs.answer ?? '')}" must be the number of the right choice, 1 to ${choices.length}.`);
		} else return { spec: { kind: 'choice', choices, answer }, notices };
		return { spec: null, notices };
	}
	if (answer === null) {
		notices.push(`answer="${String(attrs.answer ?? '')}" is not a number.`);
		return { spec: null, notices };
	}
	const tolerance = attrs.tolerance === undefined ? 0 : readNumberText(attrs.tolerance);
	if (tolerance === null || tolerance < 0) {
		notices.push(`tolerance="${String(attrs.tolerance)}" must be a number, 0 or more; checking exactly instead.`);
	}
	return { spec: { kind: 'numeric', answer, tolerance: tolerance !== null && tolerance >= 0 ? tolerance : 0, unit: String(attrs.unit ?? '').trim() }, notices };
}

const decimals = (x: number) => (String(x).split('.')[1] ?? '').length;

/** Checks a learner's answer: a typed number for numeric questions, the 1-based choice for multiple choice. */
export function checkAnswer(spec: QuizSpec, given: number): QuizCheck {
	if (spec.kind === 'choice') {
		const correct = given === spec.answer;
		return { correct, explanation: `${correct ? 'Right' : 'Not quite'}: the answer is “${spec.choices[spec.answer - 1]}”.` };
	}
	// A hair of slack so 0.1 + 0.2 style float error never fails a learner sitting exactly on the edge.
	const correct = Math.abs(given - spec.answer) <= spec.tolerance + 1e-9;
	const unit = spec.unit ? ` ${spec.unit}` : '';
	const shown = formatNumber(spec.answer, decimals(spec.answer));
	const within = spec.tolerance > 0 ? ` (anything within ±${formatNumber(spec.tolerance, decimals(spec.tolerance))} counts)` : '';
	return { correct, explanation: `${correct ? 'Right' : 'Not quite'}: the answer is ${shown}${unit}${within}.` };
}
