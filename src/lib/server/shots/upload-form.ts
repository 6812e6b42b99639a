// Reads an upload's multipart body as it arrives (busboy), keeping each file's bytes once in memory:
// no FormData, no File, no second copy of an 11 MB photograph. A file over the size limit is read past
// and dropped; only its name is kept, so the upload can say which file was too large.
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import busboy from 'busboy';
import type { ReadableStream as NodeWebReadableStream } from 'node:stream/web';

export interface UploadedFile {
	name: string;
	type: string;
	/** The bytes; empty when the file was over the limit. */
	bytes: Buffer;
	/** Infinity when the file was over the limit (its size past the limit was not counted). */
	size: number;
}

export interface UploadForm {
	/** The form's text fields, the first value of each. */
	fields: Record<string, string>;
	/** The parts of the file field, in the order sent. */
	files: UploadedFile[];
}

/** Throws when the body is not a readable multipart form (cut off, no boundary, over the server's body limit). */
export async function readUploadForm(request: Request, fileField: string, maxFileBytes: number): Promise<UploadForm> {
	const parser = busboy({
		headers: { 'content-type': request.headers.get('content-type') ?? '' },
		// busboy calls a file that reaches its limit truncated, so one byte more is allowed: a file of exactly
		// the limit is kept.
		limits: { fileSize: maxFileBytes + 1 },
		// Names as the browser sent them, path parts included, so checkFileName can refuse them plainly.
		preservePath: true,
		defParamCharset: 'utf8'
	});
	const fields: Record<string, string> = {};
	const files: UploadedFile[] = [];
	parser.on('field', (name, value) => {
		fields[name] ??= value;
	});
	parser.on('file', (name, stream, info) => {
		if (name !== fileField) {
			stream.resume();
			return;
		}
		const file: UploadedFile = { name: info.filename ?? '', type: info.mimeType, bytes: Buffer.alloc(0), size: 0 };
		files.push(file);
		const chunks: Buffer[] = [];
		stream.on('data', (chunk: Buffer) => chunks.push(chunk));
		stream.on('limit', () => (chunks.length = 0));
		// A broken form destroys the file's stream with the error the pipeline below throws.
		stream.on('error', () => {});
		// busboy finishes only after every file's 'end', so the files are whole when the pipeline is done.
		stream.on('end', () => {
			if (stream.truncated) file.size = Infinity;
			else {
				file.bytes = Buffer.concat(chunks);
				file.size = file.bytes.byteLength;
			}
		});
	});
	if (request.body) await pipeline(Readable.fromWeb(request.body as NodeWebReadableStream<Uint8Array>), parser);
	return { fields, files };
}
