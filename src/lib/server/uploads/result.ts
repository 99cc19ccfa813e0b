/**
 * The shape every upload parser answers with, and the collector that gathers
 * row errors. A parser either returns all of its data or none of it: one bad
 * row makes the whole upload fail, so nothing half-read is ever saved.
 */

/** One problem in an uploaded file, in words a spreadsheet user can act on. */
export interface UploadError {
	/** 1-based row as a spreadsheet shows it (the header is row 1); null for whole-file problems. */
	row: number | null;
	/** The column's header name as written in the file; null when the problem is not in one cell. */
	column: string | null;
	/** A full sentence, e.g. `Row 14, column "speed_m_s": "abc" is not a number.` */
	message: string;
}

export type UploadResult<Data, Summary> =
	| { ok: true; data: Data; summary: Summary; warnings: string[] }
	| { ok: false; errors: UploadError[] };

export type UploadFailure = Extract<UploadResult<unknown, unknown>, { ok: false }>;

/** Errors listed in full before the rest are only counted. */
export const DEFAULT_ERROR_LIMIT = 20;

export function failure(errors: UploadError[]): UploadFailure {
	return { ok: false, errors };
}

/** A whole-file problem (size, encoding, header): one error, no row. */
export function fileFailure(message: string): UploadFailure {
	return failure([{ row: null, column: null, message }]);
}

/** Builds the message prefix `Row 14, column "speed_m_s": `. */
export function cellMessage(row: number, column: string | null, text: string): string {
	const where = column === null ? `Row ${row}` : `Row ${row}, column "${column}"`;
	return `${where}: ${text}`;
}

/**
 * Gathers row-level errors, keeps the first `limit` in full and counts the
 * rest, so a file with 50,000 bad rows answers with a readable list.
 */
export class ErrorCollector {
	private readonly listed: UploadError[] = [];
	private unlisted = 0;

	constructor(private readonly limit = DEFAULT_ERROR_LIMIT) {}

	add(row: number | null, column: string | null, text: string): void {
		if (this.listed.length >= this.limit) {
			this.unlisted += 1;
			return;
		}
		const message = row === null ? text : cellMessage(row, column, text);
		this.listed.push({ row, column, message });
	}

	get count(): number {
		return this.listed.length + this.unlisted;
	}

	get hasErrors(): boolean {
		return this.count > 0;
	}

	/** The listed errors, plus a closing line "...and N more problems." when some were only counted. */
	toErrors(): UploadError[] {
		if (this.unlisted === 0) return [...this.listed];
		const more = this.unlisted === 1 ? 'and 1 more problem' : `and ${this.unlisted} more problems`;
		return [
			...this.listed,
			{ row: null, column: null, message: `...${more} not listed. Fix the ones above and upload again.` }
		];
	}

	toFailure(): UploadFailure {
		return failure(this.toErrors());
	}
}
