// Parses form-encoded parameters with bracketed keys (a[b][0][c]=v, expand[]=x) into nested objects.
import { ApiError, invalidParam, unknownParam } from './errors.mjs';

const KEY = /^([^[\]]+)((?:\[[^[\]]*\])*)$/;
const FORBIDDEN = new Set(['__proto__', 'prototype', 'constructor']);

/**
 * Null-prototype objects, so a key such as "hasOwnProperty" is only ever data.
 * @param {string} text
 * @returns {Record<string, any>}
 */
export function parseForm(text) {
	const root = Object.create(null);
	for (const [rawKey, value] of new URLSearchParams(text)) {
		const match = KEY.exec(rawKey);
		if (!match) throw new ApiError(400, `Invalid parameter name: ${rawKey}`, { param: rawKey });
		const path = [match[1], ...[...match[2].matchAll(/\[([^[\]]*)\]/g)].map((m) => m[1])];
		if (path.some((part) => FORBIDDEN.has(part))) throw new ApiError(400, `Invalid parameter name: ${rawKey}`, { param: rawKey });
		assign(root, path, value, rawKey);
	}
	return root;
}

/**
 * @param {Record<string, any>} target
 * @param {string[]} path
 * @param {string} value
 * @param {string} rawKey
 */
function assign(target, path, value, rawKey) {
	let node = target;
	for (let i = 0; i < path.length; i++) {
		// `[]` appends, the way `expand[]=a&expand[]=b` builds a list
		const part = path[i] === '' ? String(Object.keys(node).length) : path[i];
		const last = i === path.length - 1;
		if (last) {
			if (part in node) throw new ApiError(400, `Parameter given more than once: ${rawKey}`, { param: rawKey });
			node[part] = value;
			return;
		}
		if (!(part in node)) node[part] = Object.create(null);
		if (typeof node[part] !== 'object') throw new ApiError(400, `Invalid parameter: ${rawKey} mixes a value and a hash`, { param: rawKey });
		node = node[part];
	}
}

/**
 * @param {unknown} value
 * @returns {value is Record<string, any>}
 */
export function isHash(value) {
	return typeof value === 'object' && value !== null;
}

/**
 * Throws on the first key not in `allowed`, naming it the way the API does.
 * @param {Record<string, any>} hash
 * @param {string[]} allowed
 * @param {string} [prefix]
 */
export function rejectUnknownKeys(hash, allowed, prefix = '') {
	for (const key of Object.keys(hash)) {
		if (!allowed.includes(key)) throw unknownParam(prefix ? `${prefix}[${key}]` : key);
	}
}

/**
 * A list parameter arrives as a hash keyed 0, 1, 2…; returns its items in index order.
 * @param {unknown} value
 * @param {string} param
 * @returns {any[]}
 */
export function readList(value, param) {
	if (!isHash(value)) throw invalidParam(param, `Invalid array: ${param} must be a list`);
	const keys = Object.keys(/** @type {object} */ (value));
	if (!keys.every((k) => /^\d+$/.test(k))) throw invalidParam(param, `Invalid array: ${param} must be a list`);
	return keys
		.map(Number)
		.sort((a, b) => a - b)
		.map((k) => /** @type {Record<string, any>} */ (value)[String(k)]);
}

/**
 * @param {unknown} value
 * @param {string} param
 */
export function readString(value, param) {
	if (typeof value !== 'string') throw invalidParam(param, `Invalid string: ${param} must be a string`);
	return value;
}

/**
 * @param {unknown} value
 * @param {string} param
 * @param {number} min
 */
export function readInteger(value, param, min) {
	if (typeof value !== 'string' || !/^-?\d+$/.test(value)) throw invalidParam(param, `Invalid integer: ${String(value)}`);
	const n = Number(value);
	if (!Number.isSafeInteger(n)) throw invalidParam(param, `Invalid integer: ${value}`);
	if (n < min) throw invalidParam(param, `This value must be greater than or equal to ${min}.`);
	return n;
}

/**
 * Metadata: string values, at most 50 keys of up to 40 characters, values up to 500 (the API's limits).
 * @param {unknown} value
 * @param {string} param
 * @returns {Record<string, string>}
 */
export function readMetadata(value, param) {
	if (value === undefined || value === '') return {};
	if (!isHash(value)) throw invalidParam(param, `Invalid hash: ${param} must be a set of key-value pairs`);
	const entries = Object.entries(/** @type {object} */ (value));
	if (entries.length > 50) throw invalidParam(param, `Invalid ${param}: up to 50 keys are allowed; you passed ${entries.length}.`);
	/** @type {Record<string, string>} */
	const out = {};
	for (const [key, v] of entries) {
		const name = `${param}[${key}]`;
		if (typeof v !== 'string') throw invalidParam(name, `Invalid ${name}: metadata values must be strings`);
		if (key.length > 40) throw invalidParam(name, `Metadata keys can have up to 40 characters; "${key}" has ${key.length}.`);
		if (v.length > 500) throw invalidParam(name, `Metadata values can have up to 500 characters; ${name} has ${v.length}.`);
		out[key] = v;
	}
	return out;
}

/**
 * `expand[]` / `expand[0]`: a list of dotted paths.
 * @param {unknown} value
 * @returns {string[]}
 */
export function readExpand(value) {
	if (value === undefined) return [];
	return readList(value, 'expand').map((path, i) => readString(path, `expand[${i}]`));
}
