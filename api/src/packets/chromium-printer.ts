import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import puppeteer, { type Browser, type HTTPRequest, type Page } from 'puppeteer-core';

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

/**
 * A change made in place to a loaded page's elements (those `selector` matches): Chromium lays the
 * page out for print when it prints, so a page edited before its print prints as the HTML it has then.
 */
export interface PageEdit {
  selector: string;
  /** Their text (textContent): e.g. the contents' page numbers, in cells of a fixed width. */
  text?: string;
  /** Their content as markup (innerHTML): our own markup only (a drawing's SVG), never a user's text. */
  markup?: string;
  /** A class of theirs exchanged for another: `[from, to]`. */
  swapClass?: readonly [string, string];
}

/** A page loaded with its HTML (fonts decoded), ready to print; closed by its owner. */
export interface LoadedPage {
  /**
   * Makes the edits in place (no reload), in order. Resolves with how many elements each edit changed
   * (a swapClass counts only elements that had the `from` class).
   */
  edit(edits: readonly PageEdit[]): Promise<number[]>;
  /** Prints the page as it is now. */
  print(): Promise<Buffer>;
  close(): Promise<void>;
}

/** The printer's pages for one job of work (a packet): it holds one of the printer's turns throughout. */
export interface PrintSession {
  print(request: PrintRequest): Promise<Buffer>;
  /** Loads a page and leaves it open: the caller prints it (possibly more than once) and closes it. */
  load(request: PrintRequest): Promise<LoadedPage>;
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

/** A blank page with scripts off and every request held for {@link isAllowedRequest}. */
async function openBlankPage(browser: Browser): Promise<Page> {
  const page = await browser.newPage();
  try {
    await page.setJavaScriptEnabled(false);
    await page.setRequestInterception(true);
    return page;
  } catch (error) {
    await page.close().catch(() => undefined);
    throw error;
  }
}

/**
 * One headless Chromium for this process, launched on first use and reused; each print gets its own
 * page with JavaScript disabled and every network request refused. Framework-free so the benchmark
 * can drive it directly; `PdfRendererService` owns one in the Nest app.
 *
 * Opening a page (a new renderer) takes a few hundred milliseconds, so one blank page is kept open
 * ahead: each load takes it and opens the next one while it loads. A page is never given new HTML
 * (only edited in place, see {@link LoadedPage.edit}).
 */
export class ChromiumPrinter {
  private browser: Promise<Browser> | undefined;
  private profileDir: string | undefined;
  private active = 0;
  private readonly waiting: (() => void)[] = [];
  private isClosed = false;
  /** The blank page the next print takes (already without JavaScript and with requests intercepted). */
  private spare: { browser: Browser; page: Promise<Page> } | undefined;

  constructor(private readonly options: ChromiumPrinterOptions) {}

  async print(request: PrintRequest): Promise<Buffer> {
    return this.session((pages) => pages.print(request));
  }

  /**
   * One turn of the printer (`concurrency` counts these) for `work`, which may use more than one page
   * at once: the packet loads its final page while its page-numbering draft prints beside it.
   */
  async session<T>(work: (pages: PrintSession) => Promise<T>): Promise<T> {
    await this.acquire();
    try {
      return await work({
        print: async (request) => {
          const page = await this.load(request);
          try {
            return await page.print();
          } finally {
            await page.close();
          }
        },
        load: (request) => this.load(request),
      });
    } finally {
      this.release();
    }
  }

  private async load(request: PrintRequest): Promise<LoadedPage> {
    const page = await this.takePage();
    try {
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
    } catch (error) {
      await page.close().catch(() => undefined);
      throw error;
    }
    return {
      edit: async (edits) => {
        // A string expression (the API is compiled without the DOM library); the edits travel as JSON.
        const counts = await page.evaluate(
          `(${JSON.stringify(edits)}).map((e) => { let n = 0; for (const el of document.querySelectorAll(e.selector)) {` +
            ` if (e.swapClass) { if (!el.classList.replace(e.swapClass[0], e.swapClass[1])) continue; }` +
            ` if (e.markup !== undefined) el.innerHTML = e.markup; if (e.text !== undefined) el.textContent = e.text; n += 1; } return n; })`,
        );
        return (counts as unknown[]).map(Number);
      },
      print: async () => {
        const pdf = await page.pdf({
          // The fonts were awaited after loading; puppeteer's own wait would cost another round trip.
          waitForFonts: false,
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
      },
      close: () => page.close().catch(() => undefined),
    };
  }

  /** A fresh page of the current browser: the one kept ahead when it is there, else a new one. */
  private async takePage(): Promise<Page> {
    const browser = await this.getBrowser();
    const spare = this.spare;
    this.spare = undefined;
    let page = spare && spare.browser === browser ? await spare.page.catch(() => undefined) : undefined;
    if (!page || page.isClosed()) page = await openBlankPage(browser);
    this.openSpare(browser);
    return page;
  }

  private openSpare(browser: Browser): void {
    if (this.isClosed || this.spare) return;
    const spare = { browser, page: openBlankPage(browser) };
    // A spare that failed to open is simply not there: the next print opens its own page.
    spare.page.catch(() => {
      if (this.spare === spare) this.spare = undefined;
    });
    this.spare = spare;
  }

  async close(): Promise<void> {
    this.isClosed = true;
    const spare = this.spare;
    this.spare = undefined;
    await (await spare?.page.catch(() => undefined))?.close().catch(() => undefined);
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
