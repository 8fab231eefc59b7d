// The spec form's description of every criterion kind, built from the spec's zod schema plus the words table:
// fields, types, limits and defaults come from the schema, so a new kind shows up without touching the form.
import { z } from 'zod';
import { criterionSchema, RUBRIC_ITEMS } from '../grading/index';
import { COMMON_FIELDS, CRITERION_WORDS } from './criterion-words';
import type { FieldInput, FormField, FormKind } from '../../authoring/spec-draft';

type JsonProp = {
	type?: string;
	minimum?: number;
	maximum?: number;
	exclusiveMinimum?: number;
	exclusiveMaximum?: number;
	default?: unknown;
	items?: { type?: string };
};
type JsonVariant = { properties: Record<string, JsonProp & { const?: string }>; required?: string[] };

function inputOf(prop: JsonProp): FieldInput {
	if (prop.type === 'array') return prop.items?.type === 'number' ? 'numbers' : 'frames';
	if (prop.type === 'boolean') return 'boolean';
	return prop.type === 'string' ? 'frame' : 'number';
}

function fieldOf(kind: string, name: string, prop: JsonProp, required: boolean): FormField {
	const words = CRITERION_WORDS[kind]?.fields[name] ?? COMMON_FIELDS[name];
	return {
		name,
		label: words?.label ?? name,
		help: words?.help ?? '',
		unit: words?.unit ?? '',
		input: words?.input ?? inputOf(prop),
		required,
		min: prop.minimum ?? prop.exclusiveMinimum ?? null,
		max: prop.maximum ?? prop.exclusiveMaximum ?? null,
		step: words?.step ?? null,
		default: prop.default ?? null
	};
}

function starterValue(kind: string, field: FormField): unknown {
	const example = CRITERION_WORDS[kind]?.fields[field.name]?.example;
	if (example !== undefined) return example;
	if (field.input === 'number' || field.input === 'seconds') return field.min !== null && field.min > 0 ? field.min : 1;
	return undefined;
}

let cached: FormKind[] | null = null;

/** Every kind the spec accepts, in the schema's order, with its fields described for the form. */
export function specFormKinds(): FormKind[] {
	if (cached) return cached;
	const json = z.toJSONSchema(criterionSchema, { io: 'input', unrepresentable: 'any' }) as { oneOf?: JsonVariant[]; anyOf?: JsonVariant[] };
	const variants = json.oneOf ?? json.anyOf ?? [];
	cached = variants.map((variant) => {
		const kind = String(variant.properties.kind.const);
		const required = new Set(variant.required ?? []);
		const fields = Object.entries(variant.properties)
			.filter(([name]) => name !== 'kind')
			.map(([name, prop]) => fieldOf(kind, name, prop, required.has(name)));
		const starter: Record<string, unknown> = { kind };
		// required fields, and optional ones with an example (an aperture range needs one of its ends)
		for (const f of fields) if (f.required || CRITERION_WORDS[kind]?.fields[f.name]?.example !== undefined) starter[f.name] = starterValue(kind, f);
		return { kind, label: CRITERION_WORDS[kind]?.label ?? kind, help: CRITERION_WORDS[kind]?.help ?? '', fields, starter };
	});
	return cached;
}

/** The rubric items an author may choose from. */
export function rubricChoices() {
	return RUBRIC_ITEMS.map(({ id, label, hint }) => ({ id, label, hint }));
}
