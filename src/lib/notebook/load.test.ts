import { describe, expect, it } from 'vitest';
import { formatWhen } from './load';

describe('formatWhen', () => {
	it('writes UTC and says so: what the server renders and the page hydrates with', () => {
		expect(formatWhen('2026-10-06T18:40:00Z')).toBe('6 Oct 2026, 18:40 UTC');
		expect(formatWhen(new Date('2026-10-06T23:59:00Z'), 'date')).toBe('6 Oct 2026');
	});

	it('in the reader’s zone once live, naming the zone; the same instant either way', () => {
		// Whatever zone this process runs in, the local text names its zone and differs from UTC only by it.
		const local = formatWhen('2026-10-06T18:40:00Z', 'datetime', 'local');
		const zone = new Intl.DateTimeFormat('en-GB', { timeZoneName: 'short' }).formatToParts(new Date('2026-10-06T18:40:00Z')).find((p) => p.type === 'timeZoneName')!.value;
		expect(local.endsWith(zone)).toBe(true);
		expect(local).toMatch(/^\d{1,2} [A-Z][a-z]{2} 2026, \d{2}:\d{2} /);
	});

	it('gives back what is not a date as it came', () => {
		expect(formatWhen('not a date')).toBe('not a date');
	});
});
