// The upload's multipart reader, on bodies serialised by the platform's own FormData (as fetch and a
// browser send them).
import { describe, expect, it } from 'vitest';
import { readUploadForm } from './upload-form';

function post(form: FormData) {
	return new Request('http://127.0.0.1/upload', { method: 'POST', body: form });
}

const bytesOf = (n: number, seed = 1) => Uint8Array.from({ length: n }, (_, i) => (i * seed + 7) % 251);

describe('readUploadForm', () => {
	it('keeps the files of the field in the order sent, byte for byte, with their names as sent, and the first value of each field', async () => {
		const form = new FormData();
		form.append('files', new Blob([bytesOf(70_000)], { type: 'image/jpeg' }), 'Öl auf Holz – 01.jpg');
		form.append('sessionId', 'first');
		form.append('files', new Blob([bytesOf(10, 3)], { type: 'image/png' }), '../../etc/passwd.png');
		form.append('other', new Blob([bytesOf(5)]), 'ignored.bin');
		form.append('sessionId', 'second');
		const read = await readUploadForm(post(form), 'files', 1_000_000);
		expect(read.fields).toEqual({ sessionId: 'first' });
		expect(read.files.map((f) => [f.name, f.type, f.size])).toEqual([
			['Öl auf Holz – 01.jpg', 'image/jpeg', 70_000],
			['../../etc/passwd.png', 'image/png', 10]
		]);
		expect(Buffer.compare(read.files[0].bytes, Buffer.from(bytesOf(70_000)))).toBe(0);
		expect(Buffer.compare(read.files[1].bytes, Buffer.from(bytesOf(10, 3)))).toBe(0);
	});

	it('drops a file over the limit (size Infinity, no bytes kept) and still reads the files after it', async () => {
		const form = new FormData();
		form.append('files', new Blob([bytesOf(2_001)]), 'big.jpg');
		form.append('files', new Blob([bytesOf(2_000)]), 'at-the-limit.jpg');
		const read = await readUploadForm(post(form), 'files', 2_000);
		expect(read.files.map((f) => [f.name, f.size, f.bytes.byteLength])).toEqual([
			['big.jpg', Infinity, 0],
			['at-the-limit.jpg', 2_000, 2_000]
		]);
	});

	it('keeps an empty file as an empty file', async () => {
		const form = new FormData();
		form.append('files', new Blob([]), 'empty.jpg');
		const read = await readUploadForm(post(form), 'files', 2_000);
		expect(read.files.map((f) => [f.name, f.size])).toEqual([['empty.jpg', 0]]);
	});

	it('throws on a body cut off part-way and on a multipart type without a boundary', async () => {
		const form = new FormData();
		form.append('files', new Blob([bytesOf(50_000)]), 'a.jpg');
		const whole = post(form);
		const type = whole.headers.get('content-type')!;
		const body = new Uint8Array(await whole.arrayBuffer());
		const cut = new Request('http://127.0.0.1/upload', { method: 'POST', headers: { 'content-type': type }, body: body.subarray(0, 30_000) });
		await expect(readUploadForm(cut, 'files', 1_000_000)).rejects.toThrow();
		const noBoundary = new Request('http://127.0.0.1/upload', { method: 'POST', headers: { 'content-type': 'multipart/form-data' }, body: body });
		await expect(readUploadForm(noBoundary, 'files', 1_000_000)).rejects.toThrow();
	});
});
