// Characters no text field may carry: PostgreSQL refuses NUL in text and jsonb, and other control characters or
// lone UTF-16 halves are never meant and print as garbage. Tab, line feed and carriage return stay allowed.

// eslint-disable-next-line no-control-regex
const forbidden = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

export function hasUnstorable(text: string): boolean {
	return forbidden.test(text);
}

/** A readable name for the first offending character, for the error message. */
export function describeUnstorable(text: string): string | null {
	const match = forbidden.exec(text);
	if (!match) return null;
	const code = match[0].charCodeAt(0);
	if (code === 0) return 'a NUL character';
	if (code >= 0xd800 && code <= 0xdfff) return 'a broken character (half of a UTF-16 pair)';
	return `a control character (U+${code.toString(16).toUpperCase().padStart(4, '0')})`;
}

/** Every string inside a parsed JSON value (keys too). */
export function firstUnstorableInJson(value: unknown): string | null {
	if (typeof value === 'string') return describeUnstorable(value);
	if (Array.isArray(value)) {
		for (const v of value) {
			const found = firstUnstorableInJson(v);
			if (found) return found;
		}
		return null;
	}
	if (value && typeof value === 'object') {
		for (const [k, v] of Object.entries(value)) {
			const found = describeUnstorable(k) ?? firstUnstorableInJson(v);
			if (found) return found;
		}
	}
	return null;
}

/** Every text field of a parsed form (names, values and file names); for the upload routes, which parse their own. */
export function firstUnstorableInForm(form: FormData): string | null {
	return firstUnstorableInJson([...form].flatMap(([k, v]) => [k, typeof v === 'string' ? v : v.name]));
}

export function unstorableFormMessage(found: string): string {
	return `The form contains ${found}, which we cannot store. Remove it (it may have come with pasted text) and try again.`;
}
