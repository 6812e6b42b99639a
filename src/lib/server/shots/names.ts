// What a file name may be: a plain name as a browser sends it. Names are shown on pages and in object
// keys' metadata, so path parts and invisible or direction-changing characters are refused, not guessed at.

const MAX_NAME_CHARS = 200;
// C0/C1 controls, bidirectional overrides and isolates, zero-width characters, the BOM.
const ODD = /[\u0000-\u001f\u007f-\u009f\u200b-\u200f\u202a-\u202e\u2060-\u2069\ufeff]/u;

export type NameCheck = { ok: true; name: string } | { ok: false; message: string };

export function checkFileName(raw: string): NameCheck {
	const name = raw.normalize('NFC').trim();
	if (!name) return { ok: false, message: 'the file has no name' };
	if (/[/\\]/.test(name) || name === '.' || name === '..') return { ok: false, message: 'the file name must not contain a path (/ or \\)' };
	if (ODD.test(name)) return { ok: false, message: 'the file name holds invisible or direction-changing characters' };
	if (!name.isWellFormed()) return { ok: false, message: 'the file name is not valid Unicode' };
	if (name.length > MAX_NAME_CHARS) return { ok: false, message: `the file name is longer than ${MAX_NAME_CHARS} characters` };
	return { ok: true, name };
}
