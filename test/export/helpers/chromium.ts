/**
 * Headless Chromium for the plot tests: a screenshot of a file, and the DOM it parsed (so an XML error
 * shows as a <parsererror> element). Each call gets its own profile directory, removed afterwards.
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { promisify } from 'node:util';

const run = promisify(execFile);
export const CHROMIUM = process.env.CHROMIUM ?? 'chromium';
/** Flags for a quiet, isolated run: no sandbox (containers), no GPU, no network chatter, no first-run UI. */
const FLAGS = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run', '--hide-scrollbars'];
/** A cold start of Chromium takes a few seconds; a minute means something hangs. */
const TIMEOUT_MS = 60_000;

async function withProfile<T>(work: (profile: string) => Promise<T>): Promise<T> {
  const profile = mkdtempSync(join(tmpdir(), 'gicladder-chromium-'));
  try {
    return await work(profile);
  } finally {
    rmSync(profile, { recursive: true, force: true });
  }
}

/** A PNG screenshot of the file at the window size. */
export function screenshot(file: string, widthPx: number, heightPx: number): Promise<Uint8Array> {
  return withProfile(async (profile) => {
    const png = join(profile, 'shot.png');
    await run(CHROMIUM, [...FLAGS, `--user-data-dir=${profile}`, `--screenshot=${png}`, `--window-size=${widthPx},${heightPx}`, pathToFileURL(file).href], { timeout: TIMEOUT_MS });
    return new Uint8Array(readFileSync(png));
  });
}

/** The serialised DOM after loading the file. */
export function dumpDom(file: string): Promise<string> {
  return withProfile(async (profile) => {
    const { stdout } = await run(CHROMIUM, [...FLAGS, `--user-data-dir=${profile}`, '--dump-dom', pathToFileURL(file).href], { timeout: TIMEOUT_MS, maxBuffer: 64 * 1024 * 1024 });
    return stdout;
  });
}

/**
 * Parses each SVG text with the browser's XML parser (DOMParser, image/svg+xml) in one page and
 * returns, per text, '' when it parsed to an <svg> root or the parser's error text. One Chromium run for
 * all of them.
 */
export async function svgParseErrors(svgTexts: readonly string[], dir: string): Promise<string[]> {
  const page = join(dir, 'parse-check.html');
  const script = `const texts = ${JSON.stringify(svgTexts).replace(/</g, '\\u003c')};
const out = texts.map((t) => {
  const doc = new DOMParser().parseFromString(t, 'image/svg+xml');
  const err = doc.getElementsByTagName('parsererror')[0];
  if (err) return err.textContent || 'parse error';
  return doc.documentElement.localName === 'svg' ? '' : 'root is ' + doc.documentElement.localName;
});
document.getElementById('result').textContent = JSON.stringify(out);`;
  writeFileSync(page, `<!DOCTYPE html><html><body><pre id="result">not run</pre><script>${script}</script></body></html>`);
  const dom = await dumpDom(page);
  const match = /<pre id="result">([\s\S]*?)<\/pre>/.exec(dom);
  if (!match) throw new Error(`no result in the page: ${dom.slice(0, 300)}`);
  const text = match[1].replace(/&quot;/g, '"').replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/&amp;/g, '&');
  return JSON.parse(text) as string[];
}
