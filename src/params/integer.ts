// Route parameter matcher: a positive whole number (row ids in addresses); anything else is a 404.
import type { ParamMatcher } from '@sveltejs/kit';

export const match = ((param: string): param is `${number}` => /^[1-9]\d{0,9}$/.test(param)) satisfies ParamMatcher;
