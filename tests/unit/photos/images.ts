import { crc32, deflateSync } from "node:zlib";

/**
 * Small real image files for the photo tests, built byte by byte from the PNG specification
 * (W3C PNG, Second Edition / ISO/IEC 15948, sections 5.2 signature, 5.3 chunk layout with a CRC-32
 * over type and data, 11.2.2 IHDR, 11.2.4 IDAT as a zlib stream of filtered scanlines, 11.2.5 IEND).
 */

const SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);

function chunk(type: string, data: Buffer): Buffer {
  const head = Buffer.alloc(8);
  head.writeUInt32BE(data.length, 0);
  head.write(type, 4, "latin1");
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(Buffer.concat([head.subarray(4), data])), 0);
  return Buffer.concat([head, data, crc]);
}

/** An 8-bit truecolour PNG, each pixel from `colour(x, y)`. */
export function pngImage(
  width: number,
  height: number,
  colour: (x: number, y: number) => [number, number, number],
): Buffer {
  const header = Buffer.alloc(13);
  header.writeUInt32BE(width, 0);
  header.writeUInt32BE(height, 4);
  header[8] = 8; // bit depth
  header[9] = 2; // colour type 2: truecolour
  // compression 0, filter method 0, no interlace: the bytes stay 0
  const rows = Buffer.alloc(height * (1 + width * 3));
  for (let y = 0; y < height; y++) {
    const start = y * (1 + width * 3); // each scanline begins with its filter type, 0 = none
    for (let x = 0; x < width; x++) rows.set(colour(x, y), start + 1 + x * 3);
  }
  return Buffer.concat([
    SIGNATURE,
    chunk("IHDR", header),
    chunk("IDAT", deflateSync(rows)),
    chunk("IEND", Buffer.alloc(0)),
  ]);
}

/** A diagonal gradient, different for each `seed`, so two photos never share bytes. */
export const gradientPng = (width: number, height: number, seed = 0) =>
  pngImage(width, height, (x, y) => [(x * 4 + seed * 40) % 256, (y * 4) % 256, (x + y + seed * 90) % 256]);
