// Files that lie about themselves, for bad-input tests: headers declaring huge pictures, tiny bodies.
import zlib from 'node:zlib';

const CRC_TABLE = Array.from({ length: 256 }, (_, n) => {
  let c = n;
  for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  return c >>> 0;
});

// CRC-32 as the PNG specification (ISO/IEC 15948, annex D) defines it.
function crc32(bytes: Buffer): number {
  let c = 0xffffffff;
  for (const b of bytes) c = CRC_TABLE[(c ^ b) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

function chunk(type: string, data: Buffer): Buffer {
  const length = Buffer.alloc(4);
  length.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, 'ascii'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body));
  return Buffer.concat([length, body, crc]);
}

/** A valid PNG header declaring width × height 8-bit RGB, with a few bytes of picture data. */
export function pngDeclaring(widthPx: number, heightPx: number): Buffer {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(widthPx, 0);
  ihdr.writeUInt32BE(heightPx, 4);
  ihdr.set([8, 2, 0, 0, 0], 8); // bit depth 8, colour type 2 (RGB), deflate, adaptive filter, no interlace
  const signature = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
  return Buffer.concat([signature, chunk('IHDR', ihdr), chunk('IDAT', zlib.deflateSync(Buffer.alloc(64))), chunk('IEND', Buffer.alloc(0))]);
}

/** A real JPEG whose start-of-frame marker is rewritten to declare width × height. */
export function jpegDeclaring(jpeg: Buffer, widthPx: number, heightPx: number): Buffer {
  const out = Buffer.from(jpeg);
  for (let i = 2; i + 9 < out.length; ) {
    if (out[i] !== 0xff) throw new Error('not a JPEG marker sequence');
    const marker = out[i + 1];
    const length = out.readUInt16BE(i + 2);
    if (marker >= 0xc0 && marker <= 0xc3) {
      out.writeUInt16BE(heightPx, i + 5);
      out.writeUInt16BE(widthPx, i + 7);
      return out;
    }
    i += 2 + length;
  }
  throw new Error('no start-of-frame marker found');
}
