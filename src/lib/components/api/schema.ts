// Reading JSON Schema (as zod 4 writes it) for the API reference page: a short type label, the
// constraints worth showing, and the parts of objects, lists and alternatives.
export type JsonSchema = {
	type?: string | string[];
	description?: string;
	properties?: Record<string, JsonSchema>;
	required?: string[];
	additionalProperties?: boolean | JsonSchema;
	items?: JsonSchema;
	anyOf?: JsonSchema[];
	oneOf?: JsonSchema[];
	enum?: unknown[];
	const?: unknown;
	format?: string;
	pattern?: string;
	minLength?: number;
	maxLength?: number;
	minimum?: number;
	maximum?: number;
	minItems?: number;
	maxItems?: number;
	default?: unknown;
};

const show = (value: unknown) => JSON.stringify(value);

/** Alternatives, with a null alternative folded into "nullable". */
export function alternatives(schema: JsonSchema): { options: JsonSchema[]; nullable: boolean } {
	const list = schema.anyOf ?? schema.oneOf ?? [];
	const options = list.filter((option) => option.type !== 'null');
	return { options, nullable: options.length < list.length };
}

export function typeLabel(schema: JsonSchema): string {
	if (schema.const !== undefined) return show(schema.const);
	if (schema.enum) return schema.enum.map(show).join(' | ');
	if (schema.anyOf || schema.oneOf) {
		const { options, nullable } = alternatives(schema);
		const label = options.map(typeLabel).join(' or ');
		return nullable ? `${label} or null` : label;
	}
	if (schema.type === 'array') return `list of ${schema.items ? typeLabel(schema.items) : 'any'}`;
	if (schema.type === 'object') return schema.properties ? 'object' : 'map of values';
	if (Array.isArray(schema.type)) return schema.type.join(' or ');
	if (schema.format) return `${schema.type ?? 'string'} (${schema.format})`;
	return schema.type ?? 'any';
}

export function constraints(schema: JsonSchema): string[] {
	const found: string[] = [];
	if (schema.pattern) found.push(`pattern ${schema.pattern}`);
	if (schema.minLength !== undefined) found.push(`at least ${schema.minLength} characters`);
	if (schema.maxLength !== undefined) found.push(`at most ${schema.maxLength} characters`);
	if (schema.minimum !== undefined) found.push(`≥ ${schema.minimum}`);
	if (schema.maximum !== undefined) found.push(`≤ ${schema.maximum}`);
	if (schema.minItems !== undefined) found.push(`at least ${schema.minItems} items`);
	if (schema.maxItems !== undefined) found.push(`at most ${schema.maxItems} items`);
	if (schema.default !== undefined) found.push(`default ${show(schema.default)}`);
	return found;
}

/** The object schema whose fields should be listed under this one, if any. */
export function fieldsOf(schema: JsonSchema): JsonSchema | null {
	if (schema.properties) return schema;
	if (schema.type === 'array' && schema.items?.properties) return schema.items;
	const { options } = alternatives(schema);
	if (options.length === 1) return fieldsOf(options[0]);
	return null;
}

/** Object alternatives (a discriminated union), each named by its constant fields. */
export function variantsOf(schema: JsonSchema): { label: string; schema: JsonSchema }[] {
	const target = schema.type === 'array' && schema.items ? schema.items : schema;
	const { options } = alternatives(target);
	if (options.length < 2 || !options.every((option) => option.properties)) return [];
	return options.map((option, index) => {
		const tags = Object.entries(option.properties ?? {})
			.filter(([, field]) => field.const !== undefined)
			.map(([name, field]) => `${name} = ${show(field.const)}`);
		return { label: tags.join(', ') || `form ${index + 1}`, schema: option };
	});
}
