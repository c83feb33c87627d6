import { fireEvent, render, screen } from '@testing-library/svelte';
import { describe, expect, it } from 'vitest';
import { emailRule } from '$lib/schemas/account';
import { fieldCheck } from '$lib/schemas/field-check';
import Field from './Field.svelte';

const props = { label: 'E-mail address', name: 'email', check: fieldCheck(emailRule) };
const box = () => screen.getByLabelText('E-mail address') as HTMLInputElement;

describe('Field', () => {
	it('says nothing while the user first types, then checks as typed once they left the field', async () => {
		render(Field, props);
		await fireEvent.input(box(), { target: { value: 'kari@' } });
		expect(box().getAttribute('aria-invalid')).toBeNull();
		await fireEvent.blur(box());
		expect(box().getAttribute('aria-invalid')).toBe('true');
		const message = document.getElementById(box().getAttribute('aria-describedby')!);
		expect(message?.textContent).toBe('Enter an e-mail address like name@example.org.');
		await fireEvent.input(box(), { target: { value: 'kari@example.org' } });
		expect(box().getAttribute('aria-invalid')).toBeNull();
	});

	it("shows the server's message until the user changes the field", async () => {
		render(Field, { ...props, value: 'taken@example.org', error: 'Use another address.' });
		expect(screen.getByText('Use another address.')).toBeTruthy();
		await fireEvent.input(box(), { target: { value: 'other@example.org' } });
		expect(screen.queryByText('Use another address.')).toBeNull();
	});
});
