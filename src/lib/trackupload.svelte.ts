// The state of one track upload in the browser: the chosen file, bytes sent (for the progress
// bar), the server's verdict, and the offer to flip depths when the server asks. The transport is
// injected so the state machine is tested without a network; the page uses `xhrTransport`.
import { checkTrackFile, refusal, type ApiErrorBody } from './tracks';

export interface TransportAnswer {
	status: number;
	body: unknown;
}
export type Transport = (
	url: string,
	file: Blob,
	onProgress: (sentBytes: number, totalBytes: number) => void
) => Promise<TransportAnswer>;

export interface UploadedTrack {
	id: string;
	name: string;
	format: string;
	points: number;
}

export class TrackUpload {
	file = $state<File | null>(null);
	phase = $state<'idle' | 'sending' | 'reading' | 'done' | 'error'>('idle');
	sent = $state(0);
	total = $state(0);
	message = $state<string | null>(null);
	askFlip = $state(false);
	uploaded = $state<UploadedTrack | null>(null);
	/** 0..1 while the bytes go up; the server then reads and checks the file. */
	progress = $derived(this.total > 0 ? Math.min(1, this.sent / this.total) : 0);
	busy = $derived(this.phase === 'sending' || this.phase === 'reading');

	constructor(
		private readonly cruiseId: string,
		private readonly transport: Transport
	) {}

	choose(file: File | null) {
		this.file = file;
		this.phase = 'idle';
		this.message = file ? checkTrackFile(file) : null;
		if (this.message) this.phase = 'error';
		this.askFlip = false;
		this.uploaded = null;
		this.sent = 0;
		this.total = file?.size ?? 0;
	}

	async send(flipDepths = false): Promise<UploadedTrack | null> {
		const file = this.file;
		if (!file || this.busy) return null;
		const tooBig = checkTrackFile(file);
		if (tooBig) {
			this.phase = 'error';
			this.message = tooBig;
			return null;
		}
		this.phase = 'sending';
		this.message = null;
		this.askFlip = false;
		this.sent = 0;
		this.total = file.size;
		// A one-off query string, not reactive state.
		// eslint-disable-next-line svelte/prefer-svelte-reactivity
		const q = new URLSearchParams({ filename: file.name });
		if (flipDepths) q.set('flipDepths', '1');
		try {
			const answer = await this.transport(
				`/api/v1/cruises/${this.cruiseId}/tracks?${q}`,
				file,
				(sent, total) => {
					this.sent = sent;
					this.total = total;
					if (sent >= total) this.phase = 'reading';
				}
			);
			if (answer.status === 201) {
				const track = (answer.body as { track: UploadedTrack }).track;
				this.phase = 'done';
				this.uploaded = track;
				this.message = `Read ${track.points.toLocaleString('en')} fixes from ${file.name}.`;
				return track;
			}
			const r = refusal(answer.status, answer.body as ApiErrorBody | null);
			this.phase = 'error';
			this.message = r.text;
			this.askFlip = r.askFlip && !flipDepths;
			return null;
		} catch (e) {
			this.phase = 'error';
			this.message = `The upload failed: ${(e as Error).message}`;
			return null;
		}
	}
}

/** XMLHttpRequest, because fetch reports no upload progress. */
export const xhrTransport: Transport = (url, file, onProgress) =>
	new Promise((resolve, reject) => {
		const xhr = new XMLHttpRequest();
		xhr.open('POST', url);
		xhr.setRequestHeader('content-type', 'application/octet-stream');
		xhr.upload.onprogress = (e) => onProgress(e.loaded, e.lengthComputable ? e.total : file.size);
		xhr.upload.onload = () => onProgress(file.size, file.size);
		xhr.onload = () => {
			let body: unknown;
			try {
				body = JSON.parse(xhr.responseText);
			} catch {
				body = null;
			}
			resolve({ status: xhr.status, body });
		};
		xhr.onerror = () => reject(new Error('the connection was lost'));
		xhr.send(file);
	});
