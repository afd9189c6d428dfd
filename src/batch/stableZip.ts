/**
 * Byte-stable .xlsx archives. exceljs packs the workbook with jszip and stamps every zip entry
 * with the time of writing, so the same workbook written twice gives different bytes. Re-packing
 * the archive with one fixed date per entry, in the same entry order and with a fixed DEFLATE
 * level, makes the bytes depend only on the contents: generated books can be committed and
 * compared, and a re-run that changes nothing changes no file.
 */
import JSZip from "jszip";

/** DEFLATE level 6: zlib's default, fixed here so a change of jszip's default cannot move bytes. */
const DEFLATE_LEVEL = 6;

/**
 * The same archive with every entry dated `date` (zip keeps a DOS date and time, to 2 s and
 * without a zone; jszip writes the Date's UTC fields). Entry order, names, folder entries and
 * contents are kept.
 */
export async function stableZip(buf: Buffer, date: Date): Promise<Buffer> {
  const input = await JSZip.loadAsync(buf);
  const output = new JSZip();
  // zip.files keeps the archive's own order (its central directory).
  for (const entry of Object.values(input.files)) {
    if (entry.dir) {
      output.file(entry.name, null, { dir: true, date, createFolders: false });
    } else {
      const data = await entry.async("uint8array");
      output.file(entry.name, data, { binary: true, date, createFolders: false });
    }
  }
  return output.generateAsync({
    type: "nodebuffer",
    compression: "DEFLATE",
    compressionOptions: { level: DEFLATE_LEVEL },
    platform: "DOS",
  });
}
