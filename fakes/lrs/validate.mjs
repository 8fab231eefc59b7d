// A statement checked against xAPI 1.0.3 by @learninglocker/xapi-validation: one readable line per problem found.
import validation from '@learninglocker/xapi-validation';

const check = validation.default ?? validation;

/** The problems of one statement (field path and kind), empty when it is valid. */
export default function validateStatement(statement) {
	if (!statement || typeof statement !== 'object' || Array.isArray(statement)) return ['a statement is a JSON object'];
	return check(statement).map((w) => `${(w.path ?? []).join('.')}: ${(w.constructor?.name ?? 'Warning').replace(/Warning$/, '')}`);
}
