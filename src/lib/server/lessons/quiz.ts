// Checks a learner's quiz answer on the server, against the quiz as the lesson's own text defines it.
import { readNumberText } from '$lib/components/widgets/parts/attrs';
import { checkAnswer, readQuizSpec } from '$lib/lessons/quiz';
import type { LessonSegment } from '$lib/lessons/widgets';

export type QuizVerdict =
	| { kind: 'no-quiz' }
	/** `quizIds`: every quiz of the lesson, in order (the lesson is complete once all are answered right). */
	| { kind: 'checked'; correct: boolean; quizIds: string[] };

/** The verdict on `answer` (a number typed or the 1-based choice) for quiz `quizId` among the lesson's segments. */
export function checkQuizAnswer(segments: readonly LessonSegment[], quizIds: readonly string[], quizId: string, answer: number | string): QuizVerdict {
	const quiz = segments.find((s) => s.kind === 'widget' && s.name === 'Quiz' && (s.props.id ?? '').trim() === quizId);
	if (!quiz || quiz.kind !== 'widget') return { kind: 'no-quiz' };
	const { spec } = readQuizSpec(quiz.props);
	const given = readNumberText(answer);
	// a quiz the author left uncheckable, or an answer that is not a number, is never right
	const correct = spec !== null && given !== null && checkAnswer(spec, given).correct;
	return { kind: 'checked', correct, quizIds: [...quizIds] };
}
