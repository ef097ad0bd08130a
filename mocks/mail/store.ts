import { simpleParser } from 'mailparser';

export interface StoredMail {
	id: number;
	receivedAt: string;
	from: string;
	to: string[];
	subject: string;
	text: string;
	html: string | null;
}

/** Mail the fake has received, newest first; kept in memory for the life of the process. */
export class MailStore {
	private messages: StoredMail[] = [];
	private nextId = 1;

	async add(raw: Buffer, envelopeTo: string[]): Promise<StoredMail> {
		const parsed = await simpleParser(raw);
		const mail: StoredMail = {
			id: this.nextId++,
			receivedAt: new Date().toISOString(),
			from: parsed.from?.text ?? '',
			to: envelopeTo.map((a) => a.toLowerCase()),
			subject: parsed.subject ?? '',
			text: parsed.text ?? '',
			html: typeof parsed.html === 'string' ? parsed.html : null
		};
		this.messages.unshift(mail);
		return mail;
	}

	list(to?: string): StoredMail[] {
		const who = to?.toLowerCase();
		return who ? this.messages.filter((m) => m.to.includes(who)) : this.messages;
	}

	get(id: number) {
		return this.messages.find((m) => m.id === id);
	}

	clear() {
		this.messages = [];
	}
}
