const { chromium } = require('playwright-core');
(async () => {
  const b = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--headless','--no-sandbox','--disable-gpu','--no-first-run','--disable-background-networking','--disable-component-update','--disable-sync'] });
  const p = await b.newPage({ viewport: { width: 1100, height: 1300 } });
  await p.goto('file://' + process.argv[2]);
  const h = await p.evaluate(() => document.body.scrollHeight);
  console.log('height', h);
  for (let y = 0, k = 0; y < h; y += 1300, k++) await p.screenshot({ fullPage: true, path: `/tmp/i12/part${k}.png`, clip: { x: 0, y, width: 1100, height: Math.min(1300, h - y) } });
  await b.close();
})();
