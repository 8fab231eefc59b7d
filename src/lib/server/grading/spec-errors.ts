// Turns zod issues into errors an author can act on: where ('criteria[2].stops') and what, in words.
import type { z } from 'zod';

export interface SpecError {
	/** Where, as an author reads it: 'criteria[2].stops' ('' for the whole spec). */
	path: string;
	message: string;
}

export function formatPath(path: readonly PropertyKey[]): string {
	return path.reduce<string>((out, key) => (typeof key === 'number' ? `${out}[${key}]` : out ? `${out}.${String(key)}` : String(key)), '');
}

const TYPE_WORDS: Record<string, string> = { number: 'a number', string: 'text', array: 'a list', object: 'an object', boolean: 'true or false' };

function describeIssue(issue: z.core.$ZodIssue): string {
	switch (issue.code) {
		case 'invalid_type':
			return issue.input === undefined ? 'is required' : `must be ${TYPE_WORDS[issue.expected] ?? issue.expected}`;
		case 'too_small':
			if (issue.origin === 'array') return `needs at least ${issue.minimum} item${Number(issue.minimum) === 1 ? '' : 's'}`;
			if (issue.origin === 'string') return 'must not be empty';
			return issue.inclusive ? `must be at least ${issue.minimum}` : `must be more than ${issue.minimum}`;
		case 'too_big':
			if (issue.origin === 'array') return `allows at most ${issue.maximum} items`;
			if (issue.origin === 'string') return `must be at most ${issue.maximum} characters`;
			return issue.inclusive ? `must be at most ${issue.maximum}` : `must be less than ${issue.maximum}`;
		case 'unrecognized_keys':
			return `has ${issue.keys.length === 1 ? 'a field' : 'fields'} the spec does not know: ${issue.keys.join(', ')}`;
		case 'invalid_union':
			return 'options' in issue && Array.isArray(issue.options) && issue.options.length > 0
				? `must be one of: ${issue.options.map(String).join(', ')}`
				: 'does not match any criterion kind';
		case 'invalid_value':
			return `must be one of: ${issue.values.map(String).join(', ')}`;
		default:
			return issue.message;
	}
}

export function toSpecErrors(error: z.ZodError): SpecError[] {
	return error.issues.map((issue) => ({ path: formatPath(issue.path), message: describeIssue(issue) }));
}

/** One line per error, for a terminal or a plain-text form message. */
export function formatSpecErrors(errors: readonly SpecError[]): string {
	return errors.map((e) => `${e.path || 'spec'} ${e.message}`).join('\n');
}

/** Thrown by grade() when handed a spec that does not validate (a caller's bug: specs are validated on save). */
export class SpecValidationError extends Error {
	readonly errors: SpecError[];
	constructor(errors: SpecError[]) {
		super(`invalid Assignment spec:\n${formatSpecErrors(errors)}`);
		this.name = 'SpecValidationError';
		this.errors = errors;
	}
}
