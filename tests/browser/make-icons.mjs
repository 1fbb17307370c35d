// Renders www/icons/icon.svg to the PNG icons the manifest lists (run by hand after editing the SVG):
//   node tests/browser/make-icons.mjs
import { chromium } from 'playwright-core';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
const HERE = path.dirname(fileURLToPath(import.meta.url));
const ICONS = path.resolve(HERE, '../../www/icons');
const svg = fs.readFileSync(path.join(ICONS, 'icon.svg'), 'utf8');
const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--headless', '--no-sandbox', '--disable-gpu'] });
for (const n of [192, 512]) {
  const page = await browser.newPage({ viewport: { width: n, height: n } });
  await page.setContent(`<html><body style="margin:0;background:transparent">${svg.replace('<svg ', `<svg width="${n}" height="${n}" `)}</body></html>`);
  await page.screenshot({ path: path.join(ICONS, `icon-${n}.png`), omitBackground: true });
  await page.close();
}
await browser.close();
