import { z } from 'zod';
import { text } from '../http/schemas';

// The sign-in form's schema, and where she may be sent after signing in: only a path on
// Seamwell itself (never another site, never a protocol-relative URL).

export const signInForm = z.object({
	email: text(254)
		.transform((s) => s.trim().toLowerCase())
		.pipe(
			z
				.string()
				.min(1, 'Enter your e-mail address.')
				.pipe(z.email('Enter an e-mail address like name@example.com.'))
		)
});

export function safeCallbackUrl(value: string | null | undefined): string {
	if (!value || !value.startsWith('/') || value.startsWith('//') || value.startsWith('/\\')) {
		return '/start';
	}
	if (value.startsWith('/auth') || value.startsWith('/signin')) return '/start';
	return value.slice(0, 500);
}
