// `[id=uuid]` in a page's folder name: a malformed id is a 404 before any load runs (no query made).
import type { ParamMatcher } from '@sveltejs/kit';
import { isUuid } from '$lib/uuid';

export const match = ((param: string) => isUuid(param)) satisfies ParamMatcher;
