// See https://svelte.dev/docs/kit/types#app.d.ts
import type { AuthSession, AuthUser } from '$lib/server/auth';
import type { Role } from '$lib/server/db/schema';

declare global {
	namespace App {
		interface Error {
			message: string;
		}
		interface Locals {
			/** the signed-in person (id, email, name, emailVerified, roles), or null */
			user: AuthUser | null;
			session: AuthSession | null;
			/** the signed-in person's roles; empty when signed out */
			roles: Role[];
		}
		// interface PageData {}
		// interface PageState {}
		// interface Platform {}
	}
}


export {};
