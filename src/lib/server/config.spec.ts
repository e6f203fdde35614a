import { describe, expect, it } from 'vitest';
import { devMailAllowed } from './config';

// The caught-mail page shows password-reset links: only for the local catcher, never where real
// mail goes out (OWASP Forgot Password Cheat Sheet: reset links reach the account's mailbox only).
describe('devMailAllowed', () => {
	it.each([
		[{ LOOM_DEV_MAIL: '1' }, true],
		[{ LOOM_DEV_MAIL: '1', SMTP_HOST: 'localhost' }, true],
		[{ LOOM_DEV_MAIL: '1', SMTP_HOST: '127.0.0.1', SMTP_PORT: '2625' }, true],
		[{}, false],
		[{ LOOM_DEV_MAIL: '0' }, false],
		[{ LOOM_DEV_MAIL: '1', SMTP_HOST: 'smtp.mail-service.example' }, false],
		[{ LOOM_DEV_MAIL: '1', SMTP_USER: 'loomwright', SMTP_PASSWORD: 'x' }, false],
		[{ LOOM_DEV_MAIL: '1', SMTP_PASSWORD: 'x' }, false]
	])('%j → %s', (env, on) => expect(devMailAllowed(env)).toBe(on));
});
