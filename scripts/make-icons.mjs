// Renders Gatewell's mark (app/icon.svg) into the PNG and ICO icons Next.js serves from app/:
// app/icon.png (192 px), app/apple-icon.png (180 px, on its own background as iOS wants) and
// app/favicon.ico (16, 32 and 48 px PNGs in one ICO). Uses Debian's headless Chromium.
// Usage: node scripts/make-icons.mjs
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';

const svg = readFileSync('app/icon.svg', 'utf8');
const work = mkdtempSync(path.join(tmpdir(), 'gatewell-icons-'));

/** One square PNG of the mark at `size` px; `background` fills the corners outside the rounded square. */
function render(size, background = 'transparent') {
  const page = path.join(work, `icon-${size}.html`);
  const out = path.join(work, `icon-${size}.png`);
  writeFileSync(
    page,
    `<!doctype html><html><body style="margin:0;background:${background}">` +
      svg.replace('<svg ', `<svg width="${size}" height="${size}" style="display:block" `) +
      '</body></html>',
  );
  execFileSync(
    '/usr/bin/chromium',
    [
      '--headless',
      '--no-first-run',
      '--disable-gpu',
      // Chromium's sandbox refuses to start as root (containers); the page is our own file.
      ...(process.getuid?.() === 0 ? ['--no-sandbox'] : []),
      '--hide-scrollbars',
      '--force-device-scale-factor=1',
      '--default-background-color=00000000',
      `--window-size=${size},${size}`,
      `--screenshot=${out}`,
      `file://${page}`,
    ],
    { stdio: 'ignore' },
  );
  return readFileSync(out);
}

/** An ICO holding PNG images (the ICO format allows PNG entries since Windows Vista). */
function ico(images) {
  const header = Buffer.alloc(6);
  header.writeUInt16LE(0, 0);
  header.writeUInt16LE(1, 2);
  header.writeUInt16LE(images.length, 4);
  const entries = [];
  let offset = 6 + 16 * images.length;
  for (const { size, png } of images) {
    const entry = Buffer.alloc(16);
    entry.writeUInt8(size >= 256 ? 0 : size, 0);
    entry.writeUInt8(size >= 256 ? 0 : size, 1);
    entry.writeUInt8(0, 2);
    entry.writeUInt8(0, 3);
    entry.writeUInt16LE(1, 4);
    entry.writeUInt16LE(32, 6);
    entry.writeUInt32LE(png.length, 8);
    entry.writeUInt32LE(offset, 12);
    offset += png.length;
    entries.push(entry);
  }
  return Buffer.concat([header, ...entries, ...images.map((image) => image.png)]);
}

try {
  writeFileSync('app/icon.png', render(192));
  writeFileSync('app/apple-icon.png', render(180, '#0b5f63'));
  writeFileSync('app/favicon.ico', ico([16, 32, 48].map((size) => ({ size, png: render(size) }))));
  console.log('wrote app/icon.png, app/apple-icon.png, app/favicon.ico');
} finally {
  rmSync(work, { recursive: true, force: true });
}
