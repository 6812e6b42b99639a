// Real PNG files for tests of the thumbnail limit (never imported by the app). Written with node:zlib
// after the PNG specification (W3C, Portable Network Graphics, 3rd ed., §5 "Datastream structure":
// signature, then chunks of length, type, data and CRC-32; IDAT holds the zlib stream of filtered rows).
import { randomBytes } from 'node:crypto';
import { crc32, deflateSync } from 'node:zlib';

const SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
/** A chunk's length, type and CRC around its data. */
const CHUNK_OVERHEAD = 12;
/** The IDAT size browsers' encoders commonly split at. */
const IDAT_SPLIT = 8192;

function chunk(type: string, data: Uint8Array): Buffer {
	const head = Buffer.alloc(8);
	head.writeUInt32BE(data.length, 0);
	head.write(type, 4, 'latin1');
	const crc = Buffer.alloc(4);
	crc.writeUInt32BE(crc32(Buffer.concat([head.subarray(4), data])) >>> 0, 0);
	return Buffer.concat([head, data, crc]);
}

/**
 * An RGBA PNG of `width` × `height` whose pixels are noise, so it does not compress: the largest PNG
 * of that size an encoder writes. With `padToBytes`, a private ancillary chunk (which readers skip)
 * brings the file to exactly that many bytes.
 */
export function noisePng(width: number, height: number, { padToBytes }: { padToBytes?: number } = {}): Buffer {
	const rows = randomBytes(height * (1 + 4 * width));
	for (let y = 0; y < height; y++) rows[y * (1 + 4 * width)] = 0; // filter type 0 on every row
	const ihdr = Buffer.alloc(13);
	ihdr.writeUInt32BE(width, 0);
	ihdr.writeUInt32BE(height, 4);
	ihdr.set([8, 6, 0, 0, 0], 8); // 8 bits, RGBA, deflate, adaptive filtering, no interlace
	const stream = deflateSync(rows, { level: 9 });
	const idat: Buffer[] = [];
	for (let at = 0; at < stream.length; at += IDAT_SPLIT) idat.push(chunk('IDAT', stream.subarray(at, at + IDAT_SPLIT)));
	const parts = [SIGNATURE, chunk('IHDR', ihdr), ...idat];
	const end = chunk('IEND', new Uint8Array(0));
	if (padToBytes !== undefined) {
		const used = parts.reduce((n, p) => n + p.length, 0) + end.length;
		const padding = padToBytes - used - CHUNK_OVERHEAD;
		if (padding < 0) throw new Error(`a ${width} × ${height} noise PNG is already ${used} bytes`);
		parts.push(chunk('slPd', Buffer.alloc(padding)));
	}
	return Buffer.concat([...parts, end]);
}
