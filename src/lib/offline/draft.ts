/** The visit in progress, kept in the phone's storage so a reload or a closed tab loses nothing. */
export function loadDraft<T>(key: string): T | null {
	try {
		const raw = localStorage.getItem(`cornicle-draft:${key}`);
		return raw ? (JSON.parse(raw) as T) : null;
	} catch {
		return null;
	}
}

export function saveDraft(key: string, value: unknown) {
	try {
		localStorage.setItem(`cornicle-draft:${key}`, JSON.stringify(value));
	} catch {
		// Storage full or blocked: the visit still works, it just will not survive a reload.
	}
}

export function clearDraft(key: string) {
	localStorage.removeItem(`cornicle-draft:${key}`);
}
