import type { Role } from '$lib/roles';

declare global {
	namespace App {
		interface Error {
			message: string;
			code?: string;
		}
		interface Locals {
			user: SessionUser | null;
		}
	}
	interface SessionUser {
		id: number;
		email: string;
		name: string;
		role: Role;
		organisationId: number;
	}
}

export {};
