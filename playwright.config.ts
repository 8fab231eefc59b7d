import { defineConfig, devices } from '@playwright/test';

const port = Number(process.env.E2E_PORT ?? 4173);

export default defineConfig({
	testDir: 'tests/e2e',
	fullyParallel: false,
	workers: 1,
	retries: 0,
	forbidOnly: !!process.env.CI,
	reporter: [['list']],
	// generous: up to seven builds share two cores here, and a sign-in hashes with argon2 on purpose
	timeout: 90_000,
	expect: { timeout: 15_000 },
	use: {
		baseURL: `http://127.0.0.1:${port}`,
		trace: 'retain-on-failure',
		launchOptions: {
			executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
			args: ['--disable-gpu', '--disable-quic']
		}
	},
	projects: [
		{ name: 'desktop', use: { ...devices['Desktop Chrome'] }, testIgnore: /phone(-[a-z-]+)?\.spec\.ts/ },
		// the accessibility check runs in both projects: every page on a desktop and on a phone
		{ name: 'phone', use: { ...devices['Pixel 7'] }, testMatch: /(phone(-[a-z-]+)?|accessibility)\.spec\.ts/ }
	],
	webServer: {
		command: 'node build',
		url: `http://127.0.0.1:${port}/api/health`,
		reuseExistingServer: false,
		timeout: 60_000,
		// BODY_SIZE_LIMIT as `npm start` sets it: a lesson image or one part of a resumable frame upload (frames come in parts)
		env: { PORT: String(port), HOST: '127.0.0.1', ORIGIN: `http://127.0.0.1:${port}`, BODY_SIZE_LIMIT: process.env.BODY_SIZE_LIMIT ?? '16M' }
	}
});
