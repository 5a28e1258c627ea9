/**
 * `npm run icons`: renders `public/icon.svg` (the app's mark, drawn for Layerwright) to the PNG
 * sizes browsers and phones ask for, and packs 16, 32 and 48 px PNGs into `public/favicon.ico`.
 * Rendering goes through the chromium the browser tests already use; the PNGs are committed, so
 * this only runs after the SVG changes.
 */
import { readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import { chromium } from "playwright-core";

const publicDir = path.resolve(import.meta.dirname, "../../public");

/** The SVG's inner drawing on a full-bleed background, shrunk into the maskable safe zone (inner 80 %). */
function maskable(svg: string): string {
  const inner = svg.replace(/<rect width="64" height="64" rx="14" fill="#181d23"\/>/, "");
  const body = inner.slice(inner.indexOf(">") + 1, inner.lastIndexOf("</svg>"));
  return `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 64 64"><rect width="64" height="64" fill="#181d23"/><g transform="translate(9.6 9.6) scale(0.7)">${body}</g></svg>`;
}

/**
 * An ICO file holding PNG images (allowed since the format's 2006 revision): a 6-byte header,
 * a 16-byte entry per image (width, height, colours, reserved, planes, bits, size, offset), then the PNGs.
 */
export function icoFromPngs(images: { size: number; png: Buffer }[]): Buffer {
  const header = Buffer.alloc(6);
  header.writeUInt16LE(0, 0);
  header.writeUInt16LE(1, 2);
  header.writeUInt16LE(images.length, 4);
  let offset = 6 + 16 * images.length;
  const entries = images.map(({ size, png }) => {
    const e = Buffer.alloc(16);
    e.writeUInt8(size >= 256 ? 0 : size, 0);
    e.writeUInt8(size >= 256 ? 0 : size, 1);
    e.writeUInt8(0, 2);
    e.writeUInt8(0, 3);
    e.writeUInt16LE(1, 4);
    e.writeUInt16LE(32, 6);
    e.writeUInt32LE(png.length, 8);
    e.writeUInt32LE(offset, 12);
    offset += png.length;
    return e;
  });
  return Buffer.concat([header, ...entries, ...images.map((i) => i.png)]);
}

async function main() {
  const svg = readFileSync(path.join(publicDir, "icon.svg"), "utf8");
  const browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium", headless: true, args: ["--no-sandbox", "--disable-gpu", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"] });
  try {
    const render = async (source: string, size: number) => {
      const page = await browser.newPage({ viewport: { width: size, height: size }, deviceScaleFactor: 1 });
      const sized = source.replace("<svg ", `<svg width="${size}" height="${size}" `);
      await page.setContent(`<!doctype html><html><body style="margin:0;background:transparent">${sized}</body></html>`);
      const png = await page.screenshot({ omitBackground: true, clip: { x: 0, y: 0, width: size, height: size } });
      await page.close();
      return png;
    };
    const out: [string, Buffer][] = [
      ["icon-192.png", await render(svg, 192)],
      ["icon-512.png", await render(svg, 512)],
      ["apple-touch-icon.png", await render(maskable(svg), 180)],
      ["icon-maskable-512.png", await render(maskable(svg), 512)],
    ];
    const ico = icoFromPngs(await Promise.all([16, 32, 48].map(async (size) => ({ size, png: await render(svg, size) }))));
    out.push(["favicon.ico", ico]);
    for (const [name, bytes] of out) {
      writeFileSync(path.join(publicDir, name), bytes);
      console.log(`public/${name}: ${bytes.length} bytes`);
    }
  } finally {
    await browser.close();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  main().catch((e) => {
    console.error(e instanceof Error ? e.message : String(e));
    process.exit(1);
  });
}
