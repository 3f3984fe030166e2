// The upload store: files are kept under UPLOAD_DIR by the SHA-256 of their bytes (so the same file
// uploaded twice is stored once), their type is read from the bytes with file-type — never from the
// name or the declared content type — and their size is bounded.
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { fileTypeFromBuffer } from 'file-type';
import { ApiError } from '../api';
import { config } from '../config';

export const MAX_UPLOAD_BYTES = 10 * 1024 * 1024;

/** What a sea-going document may be: a PDF or a scan/photo. */
export const ACCEPTED_TYPES: Record<string, string> = {
	'application/pdf': 'PDF',
	'image/jpeg': 'JPEG',
	'image/png': 'PNG'
};

/** Refuses a declared size over the limit before the body is read. */
export function checkDeclaredSize(contentLength: string | null) {
	const n = Number(contentLength ?? 0);
	if (n > MAX_UPLOAD_BYTES) throw tooLarge(n);
}

function tooLarge(n: number) {
	const mb = (x: number) => (x / 1024 / 1024).toFixed(1);
	return new ApiError(
		413,
		`The file is ${mb(n)} MB; the largest accepted is ${mb(MAX_UPLOAD_BYTES)} MB.`
	);
}

/** Checks size and type from the bytes; answers the MIME type read from them. */
export async function check(bytes: Uint8Array): Promise<string> {
	if (bytes.byteLength === 0) throw new ApiError(400, 'The file is empty.', 'empty_file');
	if (bytes.byteLength > MAX_UPLOAD_BYTES) throw tooLarge(bytes.byteLength);
	const found = await fileTypeFromBuffer(bytes);
	if (!found || !(found.mime in ACCEPTED_TYPES))
		throw new ApiError(
			415,
			`The file is ${found ? `a ${found.ext.toUpperCase()} file` : 'not a recognised document'} ` +
				'(read from its contents); upload a PDF, JPEG or PNG.',
			'unsupported_media_type'
		);
	return found.mime;
}

function pathOf(sha256: string) {
	if (!/^[0-9a-f]{64}$/.test(sha256)) throw new Error('not a SHA-256 digest');
	return join(resolve(config.uploadDir), sha256.slice(0, 2), sha256);
}

/** Stores the bytes under their SHA-256 (written to a temporary name, then renamed into place). */
export function store(bytes: Uint8Array): string {
	const sha256 = createHash('sha256').update(bytes).digest('hex');
	const path = pathOf(sha256);
	if (!existsSync(path)) {
		mkdirSync(join(path, '..'), { recursive: true });
		const tmp = `${path}.${process.pid}.${Date.now()}.part`;
		writeFileSync(tmp, bytes);
		renameSync(tmp, path);
	}
	return sha256;
}

export function read(sha256: string): Buffer {
	return readFileSync(pathOf(sha256));
}

export function remove(sha256: string) {
	rmSync(pathOf(sha256), { force: true });
}
