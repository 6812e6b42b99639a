/**
 * The notebook list's filters as they sit in the page URL and in the setups API's query string
 * (`GET /api/v1/setups?q=&tag=&subject=&gear=&studio=&sort=&order=&page=&pageSize=`). Shared by the
 * page's `load` and the browser's search-as-you-type, so both ask the API the same question.
 */
export const SORTS = [
	{ value: 'updated-desc', label: 'Last saved, newest first' },
	{ value: 'updated-asc', label: 'Last saved, oldest first' },
	{ value: 'created-desc', label: 'Made, newest first' },
	{ value: 'title-asc', label: 'Title, A to Z' },
	{ value: 'title-desc', label: 'Title, Z to A' },
	{ value: 'subject-asc', label: 'Subject, A to Z' }
] as const;
export type SortValue = (typeof SORTS)[number]['value'];

export const PAGE_SIZE = 20;

export interface ListQuery {
	q: string;
	tag: string;
	subject: string;
	gear: string;
	studio: string;
	sort: SortValue;
	page: number;
}

export const EMPTY_QUERY: ListQuery = { q: '', tag: '', subject: '', gear: '', studio: '', sort: 'updated-desc', page: 1 };

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** Reads the page URL; anything malformed falls back to its default rather than failing the page. */
export function readListQuery(params: URLSearchParams): ListQuery {
	const text = (k: string, max: number) => (params.get(k) ?? '').trim().slice(0, max);
	const sort = params.get('sort') ?? '';
	const page = Number(params.get('page'));
	const studio = text('studio', 40);
	const gear = text('gear', 40);
	return {
		q: text('q', 200),
		tag: text('tag', 40).toLowerCase(),
		subject: text('subject', 200),
		gear: UUID.test(gear) ? gear : '',
		studio: UUID.test(studio) ? studio : '',
		sort: (SORTS.some((s) => s.value === sort) ? sort : 'updated-desc') as SortValue,
		page: Number.isInteger(page) && page >= 1 && page <= 1_000_000 ? page : 1
	};
}

/** The page's own query string: only what differs from the defaults. */
export function pageSearch(query: ListQuery, overrides: Partial<ListQuery> = {}): string {
	const q = { ...query, ...overrides };
	const p = new URLSearchParams();
	if (q.q) p.set('q', q.q);
	if (q.tag) p.set('tag', q.tag);
	if (q.subject) p.set('subject', q.subject);
	if (q.gear) p.set('gear', q.gear);
	if (q.studio) p.set('studio', q.studio);
	if (q.sort !== 'updated-desc') p.set('sort', q.sort);
	if (q.page > 1) p.set('page', String(q.page));
	const s = p.toString();
	return s ? `?${s}` : '';
}

/** The setups API's query string for the same filters. */
export function apiSearch(query: ListQuery, pageSize = PAGE_SIZE): string {
	const p = new URLSearchParams();
	if (query.q) p.set('q', query.q);
	if (query.tag) p.set('tag', query.tag);
	if (query.subject) p.set('subject', query.subject);
	if (query.gear) p.set('gear', query.gear);
	if (query.studio) p.set('studio', query.studio);
	const [sort, order] = query.sort.split('-');
	p.set('sort', sort);
	p.set('order', order);
	p.set('page', String(query.page));
	p.set('pageSize', String(pageSize));
	return `?${p}`;
}

export function isFiltered(query: ListQuery): boolean {
	return !!(query.q || query.tag || query.subject || query.gear || query.studio);
}
