import { describe, expect, it } from 'vitest';
import { alreadyHas, formatLiveEvent, formatRetry, HEARTBEAT, parseLivePosition, type LivePosition } from './live-message';

const position: LivePosition = {
	workshopId: '3c0d6a41-8b2e-4d7f-a1c3-5e9f00000101',
	lessonId: '3c0d6a41-8b2e-4d7f-a1c3-5e9f00000102',
	stepId: '3c0d6a41-8b2e-4d7f-a1c3-5e9f00000103',
	at: 1_796_272_961_658
};

/** Reads an SSE message the way the WHATWG HTML standard's event stream interpretation does (one event). */
function readEvent(text: string) {
	const fields: Record<string, string[]> = {};
	for (const line of text.split('\n')) {
		if (line === '' || line.startsWith(':')) continue;
		const colon = line.indexOf(':');
		const name = colon < 0 ? line : line.slice(0, colon);
		const value = colon < 0 ? '' : line.slice(colon + 1).replace(/^ /, '');
		(fields[name] ??= []).push(value);
	}
	return { id: fields.id?.at(-1), event: fields.event?.at(-1), data: fields.data?.join('\n'), retry: fields.retry?.at(-1) };
}

describe('the live SSE message (WHATWG HTML, server-sent events, "Interpreting an event stream")', () => {
	it('is one event: id, event name and the position as JSON, ended by a blank line', () => {
		const text = formatLiveEvent(position);
		expect(text.endsWith('\n\n')).toBe(true);
		expect(text.slice(0, -2)).not.toContain('\n\n');
		const event = readEvent(text);
		expect(event.id).toBe('1796272961658');
		expect(event.event).toBe('step');
		expect(parseLivePosition(event.data!)).toEqual(position);
	});

	it('carries "not presenting" as a null step', () => {
		const stopped = { ...position, lessonId: null, stepId: null };
		expect(parseLivePosition(readEvent(formatLiveEvent(stopped)).data!)).toEqual(stopped);
	});

	it('starts a stream with the reconnection delay, and the heartbeat is a comment no browser turns into an event', () => {
		expect(readEvent(formatRetry(2000)).retry).toBe('2000');
		expect(HEARTBEAT.startsWith(':')).toBe(true);
		expect(readEvent(HEARTBEAT)).toEqual({ id: undefined, event: undefined, data: undefined, retry: undefined });
	});

	it('refuses data that is not a position', () => {
		expect(parseLivePosition('not json')).toBeNull();
		expect(parseLivePosition('{"workshopId":"x","lessonId":null,"stepId":null,"at":1}')).toBeNull();
		expect(parseLivePosition(JSON.stringify({ ...position, at: -1 }))).toBeNull();
	});

	it('knows from Last-Event-ID whether a reconnecting browser already has the position', () => {
		expect(alreadyHas('1796272961658', position)).toBe(true);
		expect(alreadyHas('1796272961000', position)).toBe(false);
		expect(alreadyHas(null, position)).toBe(false);
		expect(alreadyHas('garbage', position)).toBe(false);
	});
});
