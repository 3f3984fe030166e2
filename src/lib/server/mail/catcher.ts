// The local SMTP catcher started by `npm start` when no SMTP server is configured: it accepts every
// message on loopback and keeps it as an .eml file that admins read in the app.
import { mkdirSync, readdirSync, readFileSync, writeFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';

export async function startCatcher(opts: { port: number; host?: string; dir: string }) {
	mkdirSync(opts.dir, { recursive: true });
	let n = 0;
	const server = new SMTPServer({
		authOptional: true,
		disabledCommands: ['STARTTLS'],
		banner: 'Wakeline local mail catcher',
		size: 25 * 1024 * 1024,
		onData(stream, _session, callback) {
			const chunks: Buffer[] = [];
			stream.on('data', (c: Buffer) => chunks.push(c));
			stream.on('end', () => {
				const name = `${Date.now()}-${process.pid}-${n++}.eml`;
				writeFileSync(join(opts.dir, name), Buffer.concat(chunks));
				callback();
			});
		}
	});
	const listen = (port: number) =>
		new Promise<number>((resolve, reject) => {
			server.once('error', reject);
			server.listen(port, opts.host ?? '127.0.0.1', () => {
				const addr = server.server.address();
				resolve(typeof addr === 'object' && addr ? addr.port : port);
			});
		});
	let port: number;
	try {
		port = await listen(opts.port);
	} catch (e) {
		// Another catcher (or anything) holds the port: take any free one; the caller uses the result.
		if ((e as NodeJS.ErrnoException).code !== 'EADDRINUSE') throw e;
		port = await listen(0);
	}
	return { server, port };
}

export interface CaughtMail {
	file: string;
	receivedAt: Date;
	from: string;
	to: string;
	subject: string;
	text: string;
	attachments: { filename: string; contentType: string; size: number }[];
}

export async function readCaught(dir: string, limit = 100): Promise<CaughtMail[]> {
	let files: string[];
	try {
		files = readdirSync(dir).filter((f) => f.endsWith('.eml'));
	} catch {
		return [];
	}
	files.sort().reverse();
	const out: CaughtMail[] = [];
	for (const file of files.slice(0, limit)) {
		const path = join(dir, file);
		const parsed = await simpleParser(readFileSync(path));
		const to = Array.isArray(parsed.to)
			? parsed.to.map((a) => a.text).join(', ')
			: (parsed.to?.text ?? '');
		out.push({
			file,
			receivedAt: statSync(path).mtime,
			from: parsed.from?.text ?? '',
			to,
			subject: parsed.subject ?? '',
			text: parsed.text ?? '',
			attachments: parsed.attachments.map((a) => ({
				filename: a.filename ?? '(unnamed)',
				contentType: a.contentType,
				size: a.size
			}))
		});
	}
	return out;
}
