import { z } from 'zod';

export const emailRule = z
	.string()
	.trim()
	.toLowerCase()
	.email('Enter an e-mail address like name@example.org.');
export const passwordRule = z
	.string()
	.min(10, 'Use at least 10 characters.')
	.max(128, 'Use at most 128 characters.');

export const signInSchema = z.object({
	email: emailRule,
	password: z.string().min(1, 'Enter your password.')
});

export const nameRule = z
	.string()
	.trim()
	.min(2, 'Enter your name (at least 2 characters).')
	.max(100);

export const signUpSchema = z
	.object({
		name: nameRule,
		email: emailRule,
		password: passwordRule,
		confirm: z.string()
	})
	.refine((v) => v.password === v.confirm, {
		path: ['confirm'],
		message: 'The two passwords differ.'
	});

export const emailOnlySchema = z.object({ email: emailRule });

export const resetPasswordSchema = z
	.object({
		token: z.string().min(1, 'The link is missing its token.'),
		password: passwordRule,
		confirm: z.string()
	})
	.refine((v) => v.password === v.confirm, {
		path: ['confirm'],
		message: 'The two passwords differ.'
	});

export const changePasswordSchema = z
	.object({
		currentPassword: z.string().min(1, 'Enter your current password.'),
		password: passwordRule,
		confirm: z.string()
	})
	.refine((v) => v.password === v.confirm, {
		path: ['confirm'],
		message: 'The two passwords differ.'
	});

export const profileSchema = z.object({ name: nameRule });
