/**
 * What every sheet of the plan workbook shares: one font family, the fills and borders, row
 * heights that show every wrapped line, and a print set-up that gives whole pages.
 *
 * Conventions fixed here:
 * - One explicit font, FONT_NAME (Arial; spreadsheet programs without it substitute a
 *   metric-compatible sans face such as Liberation Sans), set on every cell written, bold and
 *   headers included, so no cell falls back to another family.
 * - Text is never left to overflow into the next cell: text cells wrap, and the row is made
 *   tall enough for the lines the text needs (`wrappedLines`). Spreadsheet programs do not grow
 *   merged rows to fit, and each measures text differently, so the estimate errs wide: 0.95
 *   characters of 10 pt text per column-width unit (common practice, checked by printing the
 *   sample through a spreadsheet program; a width unit is the width of one digit of the
 *   default font, about 7 px), bold text 8 % wider.
 * - Print: A4, every sheet fit to one page wide (`fitToWidth: 1`). A sheet that fits on one page at no less than
 *   MIN_ONE_PAGE_SCALE of its fit-to-width size is also fit to one page tall, in whichever
 *   orientation prints it larger, so it never prints as a fragment; a longer one flows over
 *   pages (landscape when it is wide) with its table header repeated on every page
 *   (`printTitlesRow`), and `blockBreaks` breaks before a block that would be split from its
 *   heading.
 * - Page widths in points: A4 is 595 × 842 pt; a column of width w units is (7w + 5) × 0.75 pt
 *   (the spreadsheet programs' pixel rule at 96 dpi).
 */
import type ExcelJS from 'exceljs';

export const FONT_NAME = 'Arial';

/** A font of the one family; `size` in points. */
export function font(size = 10, style: { bold?: boolean; italic?: boolean; color?: string } = {}): Partial<ExcelJS.Font> {
  return {
    name: FONT_NAME,
    family: 2,
    size,
    ...(style.bold ? { bold: true } : {}),
    ...(style.italic ? { italic: true } : {}),
    ...(style.color ? { color: { argb: style.color } } : {}),
  };
}

export const FILL = {
  caution: { type: 'pattern', pattern: 'solid', fgColor: { argb: 'FFFFF2CC' } } as ExcelJS.Fill,
  header: { type: 'pattern', pattern: 'solid', fgColor: { argb: 'FFE7E6E6' } } as ExcelJS.Fill,
  /** Entry columns the technician fills only when something differs (as-run values). */
  entry: { type: 'pattern', pattern: 'solid', fgColor: { argb: 'FFF2F2F2' } } as ExcelJS.Fill,
  /** A set-point that needs a reset before the run. */
  reset: { type: 'pattern', pattern: 'solid', fgColor: { argb: 'FFFFE699' } } as ExcelJS.Fill,
  proposed: { type: 'pattern', pattern: 'solid', fgColor: { argb: 'FFDDEBF7' } } as ExcelJS.Fill,
} as const;

export const THIN: Partial<ExcelJS.Borders> = {
  top: { style: 'thin' },
  bottom: { style: 'thin' },
  left: { style: 'thin' },
  right: { style: 'thin' },
};

/** Characters of 10 pt text per column-width unit (see the header). */
const CHARS_PER_UNIT = 0.95;
const BOLD_WIDENING = 1.08;

/** Line height in points for text of `size` points. */
export function lineHeight(size: number): number {
  return Math.ceil(size * 1.32);
}

/** Lines `text` needs when wrapped at word boundaries in `width` column units at `size` pt. */
export function wrappedLines(text: string, width: number, size = 10, bold = false): number {
  const capacity = Math.max(1, Math.floor((width * CHARS_PER_UNIT * 10) / (size * (bold ? BOLD_WIDENING : 1))));
  let lines = 0;
  for (const paragraph of text.split('\n')) {
    let used = 0;
    lines += 1;
    for (const word of paragraph.split(/\s+/).filter((w) => w.length > 0)) {
      const length = [...word].length;
      if (used === 0) {
        used = length;
        // A word longer than the line breaks over several lines.
        while (used > capacity) {
          lines += 1;
          used -= capacity;
        }
      } else if (used + 1 + length <= capacity) {
        used += 1 + length;
      } else {
        lines += 1;
        used = length;
        while (used > capacity) {
          lines += 1;
          used -= capacity;
        }
      }
    }
  }
  return lines;
}

/**
 * Narrowest column (units) in which `word` fits on one line at `size` pt: 0.8 units per
 * character of 10 pt text, bold 8 % wider (measured by printing the sample through a
 * spreadsheet program; used so a header word is never broken mid-word).
 */
export function widthForWord(word: string, size = 10, bold = false): number {
  return Math.ceil([...word].length * 0.8 * (size / 10) * (bold ? BOLD_WIDENING : 1) * 2) / 2 + 0.5;
}

/** Row height (points) that shows `lines` lines of `size` pt text with a little air. */
export function heightFor(lines: number, size = 10): number {
  return lines * lineHeight(size) + 4;
}

/** Width in points of columns of `widths` units. */
export function widthInPoints(widths: readonly number[]): number {
  return widths.reduce((sum, width) => sum + (7 * width + 5) * 0.75, 0);
}

export interface CellStyle {
  size?: number;
  bold?: boolean;
  italic?: boolean;
  fill?: ExcelJS.Fill;
  border?: boolean;
  align?: 'left' | 'center' | 'right';
  numFmt?: string;
  wrap?: boolean;
  color?: string;
}

/** Writes `value` (text is written as a plain string, never a formula) with the one font. */
export function put(cell: ExcelJS.Cell, value: ExcelJS.CellValue, style: CellStyle = {}): void {
  cell.value = value;
  styleCell(cell, style);
}

export function styleCell(cell: ExcelJS.Cell, style: CellStyle = {}): void {
  cell.font = font(style.size ?? 10, { bold: style.bold, italic: style.italic, color: style.color });
  if (style.fill) cell.fill = style.fill;
  if (style.border) cell.border = THIN;
  if (style.numFmt) cell.numFmt = style.numFmt;
  // A right-aligned figure keeps one character of air from the text of the next cell, so
  // neighbouring cells never run together ("1C1").
  cell.alignment = {
    vertical: 'top',
    wrapText: style.wrap ?? typeof cell.value === 'string',
    ...(style.align ? { horizontal: style.align } : {}),
    ...(style.align === 'right' || style.align === 'left' ? { indent: 1 } : {}),
  };
}

/** A spreadsheet number format showing `decimals` decimals (`0`, `0.0`, …). */
export function decimalsFormat(decimals: number): string {
  return decimals <= 0 ? '0' : `0.${'0'.repeat(decimals)}`;
}

/**
 * A text spanning columns `from`..`to` of `row` (merged), with the row made tall enough for
 * it. Returns the row height set.
 */
export function spanText(sheet: ExcelJS.Worksheet, row: number, from: number, to: number, text: string, style: CellStyle = {}): number {
  const widths = columnWidths(sheet, from, to);
  if (to > from) sheet.mergeCells(row, from, row, to);
  put(sheet.getCell(row, from), text, { ...style, wrap: true });
  const size = style.size ?? 10;
  const height = heightFor(wrappedLines(text, widths.reduce((a, b) => a + b, 0), size, style.bold), size);
  const current = sheet.getRow(row).height ?? 0;
  sheet.getRow(row).height = Math.max(current, height);
  return sheet.getRow(row).height!;
}

/** Widths (units) of columns `from`..`to`; unset columns count as the default 9. */
export function columnWidths(sheet: ExcelJS.Worksheet, from: number, to: number): number[] {
  const widths: number[] = [];
  for (let c = from; c <= to; c++) widths.push(sheet.getColumn(c).width ?? 9);
  return widths;
}

/** Makes `row` tall enough for every cell's wrapped text (cells not merged). */
export function fitRowHeight(sheet: ExcelJS.Worksheet, rowNumber: number, minimum = 0): number {
  const row = sheet.getRow(rowNumber);
  let height = minimum;
  row.eachCell({ includeEmpty: false }, (cell, column) => {
    if (typeof cell.value !== 'string' || cell.isMerged) return;
    const size = cell.font?.size ?? 10;
    const width = sheet.getColumn(column).width ?? 9;
    height = Math.max(height, heightFor(wrappedLines(cell.value, width, size, Boolean(cell.font?.bold)), size));
  });
  row.height = Math.max(height, heightFor(1));
  return row.height;
}

/** Page geometry in points: A4 with the margins used on every sheet. */
export const PAGE = {
  portrait: { width: 595, height: 842 },
  landscape: { width: 842, height: 595 },
  /** Inches, as the spreadsheet format stores them. */
  margins: { left: 0.4, right: 0.4, top: 0.5, bottom: 0.6, header: 0.25, footer: 0.3 },
} as const;

/** A sheet fits on one page tall when that needs no more than this shrinking (common practice). */
export const MIN_ONE_PAGE_SCALE = 0.8;

function printable(orientation: 'portrait' | 'landscape'): { width: number; height: number } {
  const page = PAGE[orientation];
  const m = PAGE.margins;
  return { width: page.width - 72 * (m.left + m.right), height: page.height - 72 * (m.top + m.bottom) - 12 };
}

/** The fit-to-width scale of a sheet of `widths` (1 = printed at full size). */
export function printScale(widths: readonly number[], orientation: 'portrait' | 'landscape'): number {
  return Math.min(1, printable(orientation).width / widthInPoints(widths));
}

/** Printable page height in sheet points (before scaling) for a sheet of `widths`. */
export function pageHeight(widths: readonly number[], orientation: 'portrait' | 'landscape'): number {
  return printable(orientation).height / printScale(widths, orientation);
}

/** A sheet narrower than this share of a portrait page's width at full size goes landscape. */
const LANDSCAPE_BELOW = 0.7;

/**
 * Print set-up for a sheet: A4, fit to one page wide, the header rows `titleRows`
 * (e.g. "4:4") repeated on every page. The orientation and whether the sheet is also fit to one
 * page tall follow from its size: of the two orientations, the one that prints the whole sheet
 * on one page at the larger scale, when that costs no more than MIN_ONE_PAGE_SCALE of the
 * fit-to-width scale; otherwise a flowing sheet, landscape when portrait would shrink it below
 * LANDSCAPE_BELOW. `orientation` forces one.
 */
export function printSetup(
  sheet: ExcelJS.Worksheet,
  options: {
    widths: readonly number[];
    contentHeight: number;
    titleRows?: string;
    /** Height of the sheet down to the table's last row: the header repeats only when the table itself runs over a page. */
    tableHeight?: number;
    orientation?: 'portrait' | 'landscape';
  },
): { orientation: 'portrait' | 'landscape'; onePage: boolean } {
  const candidates = options.orientation ? [options.orientation] : (['portrait', 'landscape'] as const);
  const onePageScale = (o: 'portrait' | 'landscape') => Math.min(printScale(options.widths, o), printable(o).height / options.contentHeight);
  // One page is worth it when it shrinks the sheet by no more than MIN_ONE_PAGE_SCALE of the
  // largest size a flowing print of it could have.
  const widest = Math.max(...candidates.map((o) => printScale(options.widths, o)));
  const fitting = candidates
    .filter((o) => onePageScale(o) >= MIN_ONE_PAGE_SCALE * widest)
    .sort((a, b) => onePageScale(b) - onePageScale(a));
  const onePage = fitting.length > 0;
  const orientation = onePage
    ? fitting[0]
    : (options.orientation ?? (printScale(options.widths, 'portrait') < LANDSCAPE_BELOW ? 'landscape' : 'portrait'));
  sheet.pageSetup = {
    ...sheet.pageSetup,
    paperSize: 9,
    orientation,
    fitToPage: true,
    fitToWidth: 1,
    fitToHeight: onePage ? 1 : 0,
    // Header rows repeat only where a table runs over pages; on a one-page sheet they would
    // only stand over the notes below the table.
    ...(options.titleRows && !onePage && (options.tableHeight ?? Infinity) > pageHeight(options.widths, orientation) * 0.95
      ? { printTitlesRow: options.titleRows }
      : {}),
    margins: { ...PAGE.margins },
  };
  return { orientation, onePage };
}

/** Total height (points) of rows 1..last. */
export function contentHeight(sheet: ExcelJS.Worksheet): number {
  let total = 0;
  for (let r = 1; r <= sheet.rowCount; r++) {
    const row = sheet.getRow(r);
    if (row.hidden) continue;
    total += row.height ?? 15;
  }
  return total;
}

/**
 * Page breaks for a sheet that flows over several pages: before each block (a heading with its
 * rows, `blocks` giving its first row and height) that would otherwise be split from its
 * heading or start at the foot of a page. `capacity` is the page height in sheet points,
 * `repeated` the height of the title rows repeated on every page after the first. Only for
 * sheets not fit to one page tall (a spreadsheet program ignores manual breaks there).
 */
export function blockBreaks(
  sheet: ExcelJS.Worksheet,
  options: { capacity: number; repeated: number; lastRow: number; blocks: { row: number; height: number }[] },
): number[] {
  const starts = new Map(options.blocks.map((block) => [block.row, block.height]));
  const breaks: number[] = [];
  let used = 0;
  let first = true;
  const room = () => options.capacity * 0.95 - (first ? 0 : options.repeated);
  for (let r = 1; r <= options.lastRow; r++) {
    const row = sheet.getRow(r);
    const height = row.hidden ? 0 : (row.height ?? 15);
    const block = starts.get(r);
    if (block !== undefined && used > 0 && used + Math.min(block, room()) > room()) {
      sheet.getRow(r - 1).addPageBreak();
      breaks.push(r - 1);
      first = false;
      used = 0;
    } else if (used + height > room()) {
      first = false;
      used = 0;
    }
    used += height;
  }
  return breaks;
}

/** Footer text: small, in the one font; `&` in user text is doubled as the format requires. */
export function footer(left: string, right = 'Page &P of &N'): string {
  const face = `&"${FONT_NAME},Regular"&8`;
  return `&L${face}${left.replace(/&/g, '&&')}&R${face}${right}`;
}
