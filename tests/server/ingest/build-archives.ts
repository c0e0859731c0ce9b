/**
 * Builders of the archives the ingest tests read, written byte by byte from the published format
 * descriptions (PKWARE's APPNOTE for zip, POSIX ustar for tar, RFC 1952 for gzip), so a test can
 * make what no honest tool writes: `../` names, absolute paths, lying sizes, an encryption flag.
 */
import zlib from 'node:zlib';

/** One zip entry as the test wants it, lies included. */
export interface ZipSpec {
  name: string;
  /** Uncompressed bytes; stored or deflated according to `method`. */
  data?: Buffer;
  /** A ready raw-deflate stream (method 8), for bombs. */
  deflated?: Buffer;
  method?: 0 | 8;
  /** Declared uncompressed size; defaults to the truth. */
  size?: number;
  crc?: number;
  flags?: number;
  /** General-purpose flags of the local header only, when it should disagree with the central one. */
  localFlags?: number;
  /** Unix mode (file type and permissions), stored in the high half of the external attributes. */
  mode?: number;
}

/** A zip archive; a zip64 end record is added past 65,535 entries. */
export function buildZip(specs: ZipSpec[]): Buffer {
  const locals: Buffer[] = [];
  const centrals: Buffer[] = [];
  let offset = 0;
  for (const spec of specs) {
    const name = Buffer.from(spec.name, 'utf8');
    const method = spec.deflated ? 8 : spec.method ?? 8;
    const data = spec.data ?? Buffer.alloc(0);
    const body = spec.deflated ?? (method === 8 ? zlib.deflateRawSync(data) : data);
    const crc = spec.crc ?? zlib.crc32(data);
    const size = spec.size ?? data.length;
    const flags = (spec.flags ?? 0) | 0x800; // bit 11: names are UTF-8
    const local = Buffer.alloc(30);
    local.writeUInt32LE(0x04034b50, 0);
    local.writeUInt16LE(20, 4);
    local.writeUInt16LE(spec.localFlags === undefined ? flags : spec.localFlags | 0x800, 6);
    local.writeUInt16LE(method, 8);
    local.writeUInt16LE(0, 10);
    local.writeUInt16LE(0x21, 12);
    local.writeUInt32LE(crc >>> 0, 14);
    local.writeUInt32LE(body.length, 18);
    local.writeUInt32LE(size >>> 0, 22);
    local.writeUInt16LE(name.length, 26);
    local.writeUInt16LE(0, 28);
    locals.push(local, name, body);
    const central = Buffer.alloc(46);
    central.writeUInt32LE(0x02014b50, 0);
    central.writeUInt16LE((3 << 8) | 20, 4); // made by Unix
    central.writeUInt16LE(20, 6);
    central.writeUInt16LE(flags, 8);
    central.writeUInt16LE(method, 10);
    central.writeUInt16LE(0, 12);
    central.writeUInt16LE(0x21, 14);
    central.writeUInt32LE(crc >>> 0, 16);
    central.writeUInt32LE(body.length, 20);
    central.writeUInt32LE(size >>> 0, 24);
    central.writeUInt16LE(name.length, 28);
    const isDir = spec.name.endsWith('/');
    const mode = spec.mode ?? (isDir ? 0o040755 : 0o100644);
    central.writeUInt32LE(((mode << 16) | (isDir ? 0x10 : 0)) >>> 0, 38);
    central.writeUInt32LE(offset, 42);
    centrals.push(central, name);
    offset += local.length + name.length + body.length;
  }
  const directory = Buffer.concat(centrals);
  const tail: Buffer[] = [];
  const count = specs.length;
  if (count > 0xffff) {
    const record = Buffer.alloc(56);
    record.writeUInt32LE(0x06064b50, 0);
    record.writeBigUInt64LE(44n, 4);
    record.writeUInt16LE(45, 12);
    record.writeUInt16LE(45, 14);
    record.writeBigUInt64LE(BigInt(count), 24);
    record.writeBigUInt64LE(BigInt(count), 32);
    record.writeBigUInt64LE(BigInt(directory.length), 40);
    record.writeBigUInt64LE(BigInt(offset), 48);
    const locator = Buffer.alloc(20);
    locator.writeUInt32LE(0x07064b50, 0);
    locator.writeBigUInt64LE(BigInt(offset + directory.length), 8);
    locator.writeUInt32LE(1, 16);
    tail.push(record, locator);
  }
  const end = Buffer.alloc(22);
  end.writeUInt32LE(0x06054b50, 0);
  end.writeUInt16LE(Math.min(count, 0xffff), 8);
  end.writeUInt16LE(Math.min(count, 0xffff), 10);
  end.writeUInt32LE(directory.length, 12);
  end.writeUInt32LE(offset, 16);
  return Buffer.concat([...locals, directory, ...tail, end]);
}

/** One tar entry; `type` is the ustar type flag ('0' file, '1' hard link, '2' symlink, '3'/'4' devices, '5' folder, '6' FIFO). */
export interface TarSpec {
  name: string;
  type?: string;
  data?: Buffer;
  linkname?: string;
}

/** A ustar header block with a correct checksum. */
export function tarHeader(spec: TarSpec, size: number): Buffer {
  const block = Buffer.alloc(512);
  const put = (text: string, at: number, length: number) => block.write(text, at, length, 'utf8');
  put(spec.name, 0, 100);
  put('0000644\0', 100, 8);
  put('0000000\0', 108, 8);
  put('0000000\0', 116, 8);
  put(`${size.toString(8).padStart(11, '0')}\0`, 124, 12);
  put('00000000000\0', 136, 12);
  put('        ', 148, 8);
  put(spec.type ?? '0', 156, 1);
  put(spec.linkname ?? '', 157, 100);
  put('ustar\0', 257, 6);
  put('00', 263, 2);
  let sum = 0;
  for (const byte of block) sum += byte;
  put(`${sum.toString(8).padStart(6, '0')}\0 `, 148, 8);
  return block;
}

/** A plain tar archive ending with its two zero blocks. */
export function buildTar(specs: TarSpec[]): Buffer {
  const parts: Buffer[] = [];
  for (const spec of specs) {
    const data = spec.data ?? Buffer.alloc(0);
    parts.push(tarHeader(spec, data.length), data, Buffer.alloc((512 - (data.length % 512)) % 512));
  }
  parts.push(Buffer.alloc(1024));
  return Buffer.concat(parts);
}

const MIB = 1024 * 1024;

/**
 * A raw deflate stream of `mib` MiB of zeros built in a few milliseconds: one MiB deflated with a
 * full flush (a self-contained, byte-aligned, non-final run of blocks) repeated, then an empty
 * final block. About 1 KiB per MiB, so 4 GiB of zeros fit in about 4 MiB.
 */
export function deflatedZeros(mib: number, prefix?: Buffer): Buffer {
  const flushed = (data: Buffer) => zlib.deflateRawSync(data, { finishFlush: zlib.constants.Z_FULL_FLUSH });
  const block = flushed(Buffer.alloc(MIB));
  const parts = prefix ? [flushed(prefix)] : [];
  for (let i = 0; i < mib; i++) parts.push(block);
  parts.push(zlib.deflateRawSync(Buffer.alloc(0)));
  return Buffer.concat(parts);
}

/** A gzip file around a raw deflate stream (RFC 1952); the trailer's checksum is left at zero. */
export function gzipAround(deflated: Buffer): Buffer {
  return Buffer.concat([Buffer.from([0x1f, 0x8b, 8, 0, 0, 0, 0, 0, 0, 3]), deflated, Buffer.alloc(8)]);
}
