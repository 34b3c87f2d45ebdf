import { chromium } from 'playwright-core';
const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--headless', '--no-sandbox', '--disable-gpu'] });
const page = await browser.newPage({ viewport: { width: 1200, height: 1100 } });
await page.goto('file://' + process.argv[2]);
const h = await page.evaluate(() => document.documentElement.scrollHeight);
console.log('height', h);
for (let i = 0; i * 1100 < h && i < 12; i++) {
  await page.screenshot({ path: `${process.argv[3]}_${i}.png`, clip: { x: 0, y: i * 1100, width: 1200, height: 1100 }, fullPage: true });
}
await browser.close();
