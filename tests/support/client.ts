// A small HTTP client for the built server: keeps cookies like a browser, posts form actions the
// way SvelteKit's `enhance` does (answer as JSON), and follows nothing by itself.
import * as devalue from 'devalue';

export const appUrl = process.env.APP_URL ?? '';

export interface ActionResult {
	status: number;
	type: 'success' | 'failure' | 'redirect' | 'error';
	data?: Record<string, unknown>;
	location?: string;
	error?: { message: string; code?: string };
}

export class Client {
	readonly cookies = new Map<string, string>();

	private remember(res: Response) {
		for (const line of res.headers.getSetCookie()) {
			const [pair] = line.split(';');
			const eq = pair!.indexOf('=');
			const name = pair!.slice(0, eq).trim();
			const value = pair!.slice(eq + 1).trim();
			if (!value || /max-age=0|expires=thu, 01 jan 1970/i.test(line)) this.cookies.delete(name);
			else this.cookies.set(name, value);
		}
	}

	private headers(extra: Record<string, string> = {}) {
		const cookie = [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
		return { ...(cookie ? { cookie } : {}), ...extra };
	}

	async get(path: string, init: { accept?: string } = {}): Promise<Response> {
		const res = await fetch(new URL(path, appUrl), {
			redirect: 'manual',
			headers: this.headers(init.accept ? { accept: init.accept } : {})
		});
		this.remember(res);
		return res;
	}

	/** GET, following same-site redirects (as a browser would after clicking a link). */
	async follow(path: string, max = 5): Promise<Response> {
		let res = await this.get(path);
		for (let i = 0; i < max && res.status >= 300 && res.status < 400; i++) {
			res = await this.get(res.headers.get('location')!);
		}
		return res;
	}

	/** Posts a form action (`?/name`, or the default one with an empty name). */
	async action(path: string, action: string, fields: Record<string, string>): Promise<ActionResult> {
		const url = new URL(path, appUrl);
		if (action) url.search = `?/${action}`;
		const res = await fetch(url, {
			method: 'POST',
			redirect: 'manual',
			headers: this.headers({
				origin: new URL(appUrl).origin,
				accept: 'application/json',
				'x-sveltekit-action': 'true',
				'content-type': 'application/x-www-form-urlencoded'
			}),
			body: new URLSearchParams(fields)
		});
		this.remember(res);
		const body = (await res.json()) as {
			type: ActionResult['type'];
			status?: number;
			data?: string;
			location?: string;
			error?: ActionResult['error'];
		};
		return {
			status: body.status ?? res.status,
			type: body.type,
			data: body.data ? (devalue.parse(body.data) as Record<string, unknown>) : undefined,
			location: body.location,
			error: body.error
		};
	}

	async json<T = unknown>(path: string): Promise<{ status: number; body: T }> {
		const res = await this.get(path, { accept: 'application/json' });
		return { status: res.status, body: (await res.json()) as T };
	}

	/** A JSON API call (or a multipart upload when given FormData); the answer's body parsed when it is JSON. */
	async send<T = Record<string, unknown>>(
		method: 'POST' | 'PUT' | 'PATCH' | 'DELETE',
		path: string,
		body?: unknown
	): Promise<{ status: number; body: T }> {
		const form = body instanceof FormData;
		const res = await fetch(new URL(path, appUrl), {
			method,
			redirect: 'manual',
			headers: this.headers({
				origin: new URL(appUrl).origin,
				accept: 'application/json',
				...(body === undefined || form ? {} : { 'content-type': 'application/json' })
			}),
			body: body === undefined ? undefined : form ? body : JSON.stringify(body)
		});
		this.remember(res);
		const text = await res.text();
		return { status: res.status, body: (text && res.headers.get('content-type')?.includes('json') ? JSON.parse(text) : text) as T };
	}
}

/** Waits for the newest message to an address in the SMTP fake and returns it with its first link. */
export async function mailTo(address: string, subjectPart = '', attempts = 60): Promise<{ subject: string; text: string; link: string }> {
	for (let i = 0; i < attempts; i++) {
		const res = await fetch(`${process.env.MAILBOX_URL}/messages?to=${encodeURIComponent(address)}`);
		const list = (await res.json()) as { subject: string; text: string }[];
		const found = list.find((m) => m.subject.includes(subjectPart));
		if (found) {
			const link = /https?:\/\/\S+/.exec(found.text)?.[0] ?? '';
			return { subject: found.subject, text: found.text, link };
		}
		await new Promise((r) => setTimeout(r, 100));
	}
	throw new Error(`no message to ${address}${subjectPart ? ` about "${subjectPart}"` : ''} reached the SMTP fake`);
}

let counter = 0;
/** A fresh address per test, so tests never see each other's accounts or mail. */
export function freshEmail(label: string) {
	return `${label}-${Date.now().toString(36)}-${(counter++).toString(36)}@example.test`;
}

/**
 * A new account, signed in. Unless told not to, its address is confirmed the way a person does it:
 * the confirmation link mailed at sign-up, opened in the same browser (which keeps the password).
 */
export async function signUp(name: string, email: string, password = 'long enough password', opts: { confirm?: boolean } = {}) {
	const client = new Client();
	const result = await client.action('/signup', '', { name, email, password });
	if (result.type !== 'redirect') throw new Error(`sign-up of ${email} failed: ${JSON.stringify(result)}`);
	if (opts.confirm ?? true) {
		const mail = await mailTo(email, 'Confirm your');
		const landing = await client.follow(mail.link);
		if (landing.status !== 200) throw new Error(`confirming ${email} answered ${landing.status}`);
	}
	return client;
}
