// Made by the engineWorker plugin in vite.config.ts: the engine worker bundled into one ESM file.
declare module 'virtual:engine-worker' {
	const source: string;
	export default source;
}
