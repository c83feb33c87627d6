import { fail, redirect } from '@sveltejs/kit';
import { auth } from '$lib/server/auth';
import { authFailure } from '$lib/server/auth/errors';
import { limitAuthForm } from '$lib/server/auth/form-rate-limit';
import { getDb } from '$lib/server/db';
import { parseForm } from '$lib/schemas/form';
import { signInSchema } from '$lib/schemas/account';
import { safeNext } from '$lib/safe-next';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals, url }) => {
	if (locals.user) redirect(303, safeNext(url.searchParams.get('next')));
	// The form carries only an address that passed the rule, never the raw parameter.
	return { reset: url.searchParams.has('reset'), next: safeNext(url.searchParams.get('next'), '') };
};

export const actions: Actions = {
	default: async (event) => {
		const { request, url } = event;
		const limited = await limitAuthForm(getDb(), event, '/sign-in/email');
		if (limited) return limited;
		const form = await request.formData();
		const parsed = parseForm(signInSchema, form);
		if (!parsed.ok) return fail(400, parsed);
		try {
			await auth().api.signInEmail({ body: parsed.data, headers: request.headers });
		} catch (err) {
			return authFailure(err, { values: { email: parsed.data.email } });
		}
		redirect(303, safeNext(String(form.get('next') ?? url.searchParams.get('next') ?? '')));
	}
};
