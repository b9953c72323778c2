/**
 * The browser's one way to ask the API again as the person edits: each request cancels the one
 * before it, a failure keeps the last good answer and says why, and a success may replace the
 * page's query string (so the address bar and a reload show what is on screen).
 */
import { replaceState } from '$app/navigation';
import { page } from '$app/state';

interface ApiError {
	error?: { message?: string; field?: string };
}

export class LiveRequest<T> {
	loading = $state(false);
	error = $state<string | null>(null);
	#controller: AbortController | null = null;

	constructor(
		private readonly messages: {
			/** When the API refuses without saying why. */
			refused: string;
			/** When the server cannot be reached. */
			offline: string;
			/** Prefix the API's message with the field it names ("rows[2].formula: …"). */
			withField?: boolean;
		}
	) {}

	/** The answer, or null when refused, unreachable or overtaken by a newer request. */
	async run(path: string, init: RequestInit = {}, query?: URLSearchParams): Promise<T | null> {
		this.#controller?.abort();
		const controller = new AbortController();
		this.#controller = controller;
		this.loading = true;
		try {
			const res = await fetch(path, { ...init, signal: controller.signal });
			const body = (await res.json()) as T & ApiError;
			if (!res.ok) {
				const e = body.error;
				const field = this.messages.withField && e?.field ? `${e.field}: ` : '';
				this.error = e?.message ? field + e.message : this.messages.refused;
				return null;
			}
			this.error = null;
			if (query) {
				const url = new URL(page.url);
				url.search = query.toString();
				replaceState(url, page.state);
			}
			return body;
		} catch (e) {
			if ((e as Error).name !== 'AbortError') this.error = this.messages.offline;
			return null;
		} finally {
			if (this.#controller === controller) this.loading = false;
		}
	}
}
