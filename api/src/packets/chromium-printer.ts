import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import puppeteer, { type Browser, type HTTPRequest } from 'puppeteer-core';

export interface ChromiumPrinterOptions {
  executablePath: string;
  /** Pages printing at once; further requests wait their turn. */
  concurrency: number;
  /** Limit for loading the HTML (fonts and inline images included), ms. */
  contentTimeoutMs: number;
  /** Limit for printing the PDF, ms. */
  pdfTimeoutMs: number;
}

export interface PrintRequest {
  html: string;
  /** HTML of the running footer (Chromium's footer template: `pageNumber`, `totalPages` classes). */
  footerTemplate: string;
  /**
   * A layout-only print (the page-numbering first pass): no footer and no tagged structure, which
   * Chromium otherwise spends time on; named destinations and pagination are the same.
   */
  isDraft?: boolean;
  /** Called with every URL the page tried to load and was refused (for logs and tests). */
  onBlockedRequest?: (url: string) => void;
}

/** Chromium flags proven on Debian 12 (shared VERSIONS.md); the profile folder is added per launch. */
const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--disable-dev-shm-usage',
  '--font-render-hinting=none',
];

/**
 * Only inline content may load: `data:` URIs (our fonts, drawings, photos, logo) and the `about:blank`
 * document setContent starts from. Anything else — http(s), file, ws — is refused, so text typed by a
 * user can never reach a URL even if it were somehow rendered as markup.
 */
export function isAllowedRequest(url: string): boolean {
  return url.startsWith('data:') || url === 'about:blank';
}

/**
 * One headless Chromium for this process, launched on first use and reused; each print gets its own
 * page with JavaScript disabled and every network request refused. Framework-free so the benchmark
 * can drive it directly; `PdfRendererService` owns one in the Nest app.
 */
export class ChromiumPrinter {
  private browser: Promise<Browser> | undefined;
  private profileDir: string | undefined;
  private active = 0;
  private readonly waiting: (() => void)[] = [];
  private isClosed = false;

  constructor(private readonly options: ChromiumPrinterOptions) {}

  async print(request: PrintRequest): Promise<Buffer> {
    await this.acquire();
    try {
      const browser = await this.getBrowser();
      const page = await browser.newPage();
      try {
        await page.setJavaScriptEnabled(false);
        await page.setRequestInterception(true);
        page.on('request', (req: HTTPRequest) => {
          if (isAllowedRequest(req.url())) {
            void req.continue();
          } else {
            request.onBlockedRequest?.(req.url());
            void req.abort('blockedbyclient');
          }
        });
        await page.setContent(request.html, { waitUntil: 'load', timeout: this.options.contentTimeoutMs });
        // Page scripts are off, but DevTools evaluation still works: wait for the inline fonts to decode.
        // (A string expression: the API is compiled without the DOM library.)
        await page.evaluate('document.fonts.ready.then(() => true)');
        const pdf = await page.pdf({
          printBackground: true,
          preferCSSPageSize: true,
          displayHeaderFooter: !request.isDraft,
          tagged: !request.isDraft,
          // Bookmarks from the headings (h1–h6), one per section, for PDF readers' side panel.
          outline: !request.isDraft,
          headerTemplate: '<span></span>',
          footerTemplate: request.footerTemplate,
          timeout: this.options.pdfTimeoutMs,
        });
        return Buffer.from(pdf);
      } finally {
        await page.close().catch(() => undefined);
      }
    } finally {
      this.release();
    }
  }

  async close(): Promise<void> {
    this.isClosed = true;
    const browser = this.browser;
    this.browser = undefined;
    if (browser) await (await browser.catch(() => undefined))?.close().catch(() => undefined);
    if (this.profileDir) rmSync(this.profileDir, { recursive: true, force: true });
    this.profileDir = undefined;
  }

  private getBrowser(): Promise<Browser> {
    if (this.isClosed) throw new Error('the PDF printer is closed');
    if (!this.browser) {
      this.profileDir = mkdtempSync(join(tmpdir(), 'loamline-chromium-'));
      const launching = puppeteer.launch({
        executablePath: this.options.executablePath,
        headless: true,
        args: [...CHROMIUM_ARGS, `--user-data-dir=${this.profileDir}`],
      });
      this.browser = launching;
      launching
        .then((browser) =>
          browser.on('disconnected', () => {
            // A crashed browser is relaunched on the next print.
            if (this.browser === launching) this.browser = undefined;
          }),
        )
        .catch(() => {
          if (this.browser === launching) this.browser = undefined;
        });
    }
    return this.browser;
  }

  private async acquire(): Promise<void> {
    if (this.active < this.options.concurrency) {
      this.active += 1;
      return;
    }
    await new Promise<void>((resolve) => this.waiting.push(resolve));
  }

  private release(): void {
    const next = this.waiting.shift();
    if (next) next();
    else this.active -= 1;
  }
}
