import { Injectable, Logger, type OnApplicationShutdown } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';

import type { Env } from '../config/env.schema.js';
import { ChromiumPrinter } from './chromium-printer.js';
import { renderPacket, type RenderedPacket } from './packet-document.js';

type RenderInput = Parameters<typeof renderPacket>[1];

/**
 * Owns this process's headless Chromium (launched lazily on the first packet, reused, closed at
 * shutdown) and renders packets through it: bounded concurrency, timeouts, and a sandboxed page per
 * packet (see ChromiumPrinter).
 */
@Injectable()
export class PdfRendererService implements OnApplicationShutdown {
  private readonly logger = new Logger(PdfRendererService.name);
  private readonly printer: ChromiumPrinter;

  constructor(config: ConfigService<Env, true>) {
    const timeout = config.get('PACKET_RENDER_TIMEOUT_MS', { infer: true });
    this.printer = new ChromiumPrinter({
      executablePath: config.get('CHROMIUM_PATH', { infer: true }),
      concurrency: config.get('PACKET_RENDER_CONCURRENCY', { infer: true }),
      contentTimeoutMs: timeout,
      pdfTimeoutMs: timeout,
    });
  }

  render(input: RenderInput): Promise<RenderedPacket> {
    return renderPacket(this.printer, {
      ...input,
      onBlockedRequest: (url) => {
        this.logger.warn(`packet page tried to load a refused URL (${url.slice(0, 80)})`);
        input.onBlockedRequest?.(url);
      },
    });
  }

  /** A one-off print of a self-contained page (only data: URIs load; no footer), e.g. the locate sheet. */
  printPage(html: string): Promise<Buffer> {
    return this.printer.print({
      html,
      footerTemplate: '<span></span>',
      onBlockedRequest: (url) => this.logger.warn(`printed page tried to load a refused URL (${url.slice(0, 80)})`),
    });
  }

  async onApplicationShutdown(): Promise<void> {
    await this.printer.close();
  }
}
