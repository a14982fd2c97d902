import { Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';

import { type Env, publicAppUrl } from '../config/env.schema.js';

/** Absolute links into the web app, for messages that leave it (e-mails, QR codes). */
@Injectable()
export class LinkBuilder {
  private readonly base: string;

  constructor(config: ConfigService<Env, true>) {
    this.base = publicAppUrl({
      APP_URL: config.get('APP_URL', { infer: true }),
      HOST: config.get('HOST', { infer: true }),
      PORT: config.get('PORT', { infer: true }),
    });
  }

  to(path: string, query: Record<string, string> = {}): string {
    const url = new URL(path, `${this.base}/`);
    for (const [key, value] of Object.entries(query)) url.searchParams.set(key, value);
    return url.toString();
  }
}
