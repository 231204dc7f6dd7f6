/**
 * The uncompressed size of a ZIP archive's content, read from its central directory, so that
 * a workbook (an .xlsx is a ZIP archive) can be refused before it is unpacked: a few
 * megabytes of compressed XML can hold hundreds of megabytes of cells, and the workbook
 * reader keeps all of it in memory (about 18 bytes of memory per byte of sheet XML).
 *
 * Format: PKWARE, "APPNOTE.TXT — .ZIP File Format Specification", version 6.3.10 (2022):
 * the end-of-central-directory record (§4.3.16, signature 0x06054b50) sits in the last
 * 65 557 bytes and gives the size and offset of the central directory; each central
 * directory header (§4.3.12, signature 0x02014b50) gives an entry's uncompressed size.
 *
 * Conventions fixed here: the declared sizes are summed as given (an archive that lies about
 * them is the unpacker's to catch); ZIP64 markers (a size of 0xFFFFFFFF) count as
 * infinitely large; anything unreadable gives null, and the caller lets the workbook reader
 * report the damage in its own words.
 */

const END_SIGNATURE = 0x06054b50;
const ENTRY_SIGNATURE = 0x02014b50;
const END_RECORD_LENGTH = 22;
const MAX_COMMENT_LENGTH = 0xffff;

export function zipContentSize(bytes: Uint8Array): number | null {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const earliest = Math.max(0, bytes.length - END_RECORD_LENGTH - MAX_COMMENT_LENGTH);
  let end = -1;
  for (let at = bytes.length - END_RECORD_LENGTH; at >= earliest; at--) {
    if (view.getUint32(at, true) === END_SIGNATURE) {
      end = at;
      break;
    }
  }
  if (end < 0) return null;
  const entries = view.getUint16(end + 10, true);
  const directoryOffset = view.getUint32(end + 16, true);
  let total = 0;
  let at = directoryOffset;
  for (let entry = 0; entry < entries; entry++) {
    if (at + 46 > bytes.length || view.getUint32(at, true) !== ENTRY_SIGNATURE) return null;
    const size = view.getUint32(at + 24, true);
    if (size === 0xffffffff) return Number.POSITIVE_INFINITY;
    total += size;
    at += 46 + view.getUint16(at + 28, true) + view.getUint16(at + 30, true) + view.getUint16(at + 32, true);
  }
  return total;
}
