// usage: node look.mjs email path width out.png
import { chromium } from 'playwright-core';
const [email, path, width, out, selector] = process.argv.slice(2);
const base = process.env.BASE ?? 'http://127.0.0.1:3000';
const inboxUrl = process.env.INBOX ?? 'http://127.0.0.1:1080';
const browser = await chromium.launch({ executablePath: '/usr/bin/chromium' });
const page = await browser.newPage({ viewport: { width: Number(width), height: 900 } });
page.on('console', (m) => console.log('console', m.type(), m.text()));
page.on('pageerror', (e) => console.log('pageerror', e.message, e.stack));
const count = async () => (await (await fetch(`${inboxUrl}/api/messages?to=${encodeURIComponent(email)}`)).json()).length;
const seen = await count();
await page.goto(base + '/signin');
await page.locator('html[data-hydrated]').waitFor({ state: 'attached' });
await page.getByLabel('E-mail address').fill(email);
await page.getByRole('button', { name: 'Send me a sign-in link' }).click();
let msgs;
for (let i = 0; i < 100; i++) { msgs = await (await fetch(`${inboxUrl}/api/messages?to=${encodeURIComponent(email)}`)).json(); if (msgs.length > seen) break; await new Promise(r => setTimeout(r, 200)); }
const link = msgs[0].text.match(/https?:\/\/\S+\/signin\/confirm\S*/)[0];
await page.goto(link);
await page.getByRole('button', { name: 'Sign in to Seamwell' }).click();
await page.waitForURL((u) => !u.pathname.startsWith('/signin'));
await page.goto(base + path);
try { await page.locator('html[data-hydrated]').waitFor({ state: 'attached', timeout: 10000 }); console.log('hydrated'); } catch { console.log('NOT hydrated'); }
if (selector) await page.locator(selector).first().screenshot({ path: out }); else await page.screenshot({ path: out, fullPage: true });
const sw = await page.evaluate(() => document.documentElement.scrollWidth);
console.log('scrollWidth', sw);
await browser.close();
