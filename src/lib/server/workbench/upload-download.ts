/**
 * An uploaded file handed back for download. Uploads are CSV text, and a
 * stored file may hold cells the parser ignored (a notes column, say) that a
 * spreadsheet would run as a formula when the file is opened. Those cells are
 * defused with the exports' own rule (`neutralise` in export-csv.ts), cell by
 * cell, in the file's own delimiter and line ends; a file with no such cell
 * comes back byte for byte as uploaded. Anything that is not CSV text is
 * answered unchanged, as an opaque attachment.
 */
import Papa from 'papaparse';
import { decodeCsvBytes } from '../uploads/decode';
import { detectDelimiter, type Delimiter } from '../uploads/csv';
import { neutralise } from './export-csv';

export interface UploadDownload {
	bytes: Uint8Array<ArrayBuffer>;
	contentType: 'text/csv; charset=utf-8' | 'application/octet-stream';
	/** How many cells were defused. */
	neutralisedCells: number;
}

const UTF8_BOM = [0xef, 0xbb, 0xbf];

function hasUtf8Bom(bytes: Uint8Array): boolean {
	return UTF8_BOM.every((b, i) => bytes[i] === b);
}

/** One cell written back in the file's delimiter, quoted only when it must be (RFC 4180). */
function csvCell(cell: string, delimiter: Delimiter): string {
	return cell.includes(delimiter) || /["\r\n]/.test(cell) ? `"${cell.replace(/"/g, '""')}"` : cell;
}

export function uploadDownload(content: Uint8Array<ArrayBuffer>): UploadDownload {
	const decoded = decodeCsvBytes(content, Number.POSITIVE_INFINITY);
	if (!decoded.ok) return { bytes: content, contentType: 'application/octet-stream', neutralisedCells: 0 };

	const delimiter = detectDelimiter(decoded.text);
	const parsed = Papa.parse<string[]>(decoded.text, { delimiter, skipEmptyLines: false });
	let neutralisedCells = 0;
	const rows = parsed.data.map((cells) =>
		cells.map((cell) => {
			const safe = neutralise(cell);
			if (safe !== cell) neutralisedCells += 1;
			return safe;
		})
	);
	if (neutralisedCells === 0) return { bytes: content, contentType: 'text/csv; charset=utf-8', neutralisedCells };

	const text = rows.map((cells) => cells.map((cell) => csvCell(cell, delimiter)).join(delimiter)).join(parsed.meta.linebreak || '\n');
	return {
		bytes: new TextEncoder().encode((hasUtf8Bom(content) ? '\uFEFF' : '') + text),
		contentType: 'text/csv; charset=utf-8',
		neutralisedCells
	};
}
