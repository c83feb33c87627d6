import { describe, expect, it } from 'vitest';
import { createMailTransport } from '../../src/lib/server/mail-transport';
import { testEnv } from './env';

describe('mail catcher', () => {
	it('receives a message sent with nodemailer, with both parts, readable through its API', async () => {
		const to = `it-${Date.now()}@example.test`;
		const transport = createMailTransport({ url: testEnv.smtpUrl() });
		await transport.sendMail({
			from: 'Thermalith <no-reply@thermalith.local>',
			to,
			subject: 'Integration check',
			text: 'Plain body 42',
			html: '<p>HTML body <b>42</b></p>'
		});
		transport.close();

		const res = await fetch(`${testEnv.mailViewerUrl()}/api/messages?to=${encodeURIComponent(to)}`);
		const messages = (await res.json()) as { subject: string; text: string; html: string }[];
		expect(messages).toHaveLength(1);
		expect(messages[0].subject).toBe('Integration check');
		expect(messages[0].text.trim()).toBe('Plain body 42');
		expect(messages[0].html).toContain('<b>42</b>');
	});
});
