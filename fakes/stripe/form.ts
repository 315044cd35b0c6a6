// Stripe-style parameters: form bodies and query strings in bracket notation
// (`line_items[0][price]=…`, `metadata[key]=…`, `expand[]=…`) become nested values, and typed
// readers turn them into Stripe-shaped 400 errors when they are wrong.
import { invalid } from './http.ts';

export type ParamValue = string | ParamValue[] | Params;
export type Params = { [key: string]: ParamValue };

const UNSAFE = new Set(['__proto__', 'prototype', 'constructor']);

function splitKey(key: string): string[] {
	const open = key.indexOf('[');
	if (open <= 0) return [key];
	const segments = [key.slice(0, open)];
	const pattern = /\[([^[\]]*)\]/y;
	pattern.lastIndex = open;
	let end = open;
	let match: RegExpExecArray | null;
	while ((match = pattern.exec(key))) {
		segments.push(match[1]);
		end = pattern.lastIndex;
	}
	return end === key.length ? segments : [key];
}

function assign(root: Params, path: string[], value: string): void {
	let node: Params = root;
	for (let i = 0; i < path.length; i++) {
		const last = i === path.length - 1;
		// `[]` appends: it takes the next free index of its container.
		const key = path[i] === '' ? String(Object.keys(node).length) : path[i];
		if (last) {
			node[key] = value;
			return;
		}
		const next = node[key];
		if (typeof next !== 'object' || next === null) node[key] = {};
		node = node[key] as Params;
	}
}

/** Objects keyed 0, 1, 2… become arrays, except inside metadata (free-form keys). */
function arrayify(value: ParamValue, key: string): ParamValue {
	if (typeof value === 'string' || Array.isArray(value)) return value;
	for (const k of Object.keys(value)) value[k] = arrayify(value[k], k);
	const keys = Object.keys(value);
	if (key !== 'metadata' && keys.length > 0 && keys.every((k) => /^\d+$/.test(k))) {
		return keys.sort((a, b) => Number(a) - Number(b)).map((k) => value[k]);
	}
	return value;
}

export function parseParams(text: string): Params {
	const root: Params = {};
	for (const [key, value] of new URLSearchParams(text)) {
		const path = splitKey(key);
		if (path.some((segment) => UNSAFE.has(segment))) continue;
		assign(root, path, value);
	}
	return arrayify(root, '') as Params;
}

/** Flattens nested values back into bracket names, for logging ignored parameters. */
export function paramNames(params: Params, prefix = ''): string[] {
	return Object.entries(params).flatMap(([key, value]) => {
		const name = prefix ? `${prefix}[${key}]` : key;
		if (typeof value === 'string') return [name];
		if (Array.isArray(value)) return [name];
		return paramNames(value, name);
	});
}

// ── typed readers ────────────────────────────────────────────────────────────────────────────

type Source = Params | undefined;

function where(prefix: string, name: string): string {
	return prefix ? `${prefix}[${name}]` : name;
}

export function optString(p: Source, name: string, prefix = ''): string | undefined {
	const value = p?.[name];
	if (value === undefined) return undefined;
	if (typeof value !== 'string') {
		throw invalid(
			`Invalid string: ${where(prefix, name)} must be a plain value`,
			where(prefix, name)
		);
	}
	return value;
}

export function reqString(p: Source, name: string, prefix = ''): string {
	const value = optString(p, name, prefix);
	if (value === undefined || value === '') {
		throw invalid(
			`Missing required param: ${where(prefix, name)}.`,
			where(prefix, name),
			'parameter_missing'
		);
	}
	return value;
}

/** A string that may be cleared: Stripe takes an empty value as "unset" (null). */
export function optNullableString(p: Source, name: string): string | null | undefined {
	const value = optString(p, name);
	return value === '' ? null : value;
}

export function optInteger(
	p: Source,
	name: string,
	{ min = 0, max = Number.MAX_SAFE_INTEGER, prefix = '' } = {}
): number | undefined {
	const raw = optString(p, name, prefix);
	if (raw === undefined) return undefined;
	const param = where(prefix, name);
	if (!/^-?\d+$/.test(raw)) {
		throw invalid(`Invalid integer: ${raw}`, param, 'parameter_invalid_integer');
	}
	const value = Number(raw);
	if (value < min || value > max) {
		const range = max === Number.MAX_SAFE_INTEGER ? `at least ${min}` : `between ${min} and ${max}`;
		throw invalid(`${param} must be ${range}; got ${raw}.`, param, 'parameter_invalid_integer');
	}
	return value;
}

export function optBoolean(p: Source, name: string): boolean | undefined {
	const raw = optString(p, name);
	if (raw === undefined) return undefined;
	if (raw !== 'true' && raw !== 'false') {
		throw invalid(`Invalid boolean: ${raw}`, name, 'parameter_invalid_boolean');
	}
	return raw === 'true';
}

export function optObject(p: Source, name: string, prefix = ''): Params | undefined {
	const value = p?.[name];
	if (value === undefined) return undefined;
	if (typeof value === 'string' || Array.isArray(value)) {
		throw invalid(
			`Invalid object: ${where(prefix, name)} must be a hash of values`,
			where(prefix, name)
		);
	}
	return value;
}

export function optArray(p: Source, name: string): ParamValue[] | undefined {
	const value = p?.[name];
	if (value === undefined) return undefined;
	if (!Array.isArray(value)) throw invalid(`Invalid array: ${name} must be a list`, name);
	return value;
}

export type Metadata = Record<string, string>;

/**
 * Metadata updates merge into `current`: a key set to '' is removed, and `metadata=` (empty)
 * clears everything, as Stripe documents.
 */
export function readMetadata(
	p: Source,
	name: string,
	current: Metadata = {},
	prefix = ''
): Metadata | undefined {
	const value = p?.[name];
	if (value === undefined) return undefined;
	const param = where(prefix, name);
	if (value === '') return {};
	if (typeof value === 'string' || Array.isArray(value)) {
		throw invalid(`Invalid hash: ${param} must be key-value pairs`, param);
	}
	const next: Metadata = { ...current };
	for (const [key, v] of Object.entries(value)) {
		if (typeof v !== 'string')
			throw invalid(`Metadata values must be strings (${param}[${key}])`, param);
		if (key.length > 40) throw invalid(`Metadata keys may be at most 40 characters: ${key}`, param);
		if (v.length > 500)
			throw invalid(`Metadata values may be at most 500 characters (${key})`, param);
		if (v === '') delete next[key];
		else next[key] = v;
	}
	if (Object.keys(next).length > 50) throw invalid('Metadata may hold at most 50 keys', param);
	return next;
}

/** `expand[]=a&expand[]=b.c` (the SDK sends `expand[0]=…`) as a list of dotted paths. */
export function readExpand(p: Source): string[] {
	const value = p?.expand;
	if (value === undefined) return [];
	const list = Array.isArray(value) ? value : [value];
	return list.map((v) => {
		if (typeof v !== 'string')
			throw invalid('Invalid array: expand must list field names', 'expand');
		return v;
	});
}
