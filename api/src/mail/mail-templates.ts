import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

import { Injectable } from '@nestjs/common';
import Handlebars from 'handlebars';

/** templates/ at the repository root (the same relative path from api/src and api/dist). */
export const TEMPLATES_DIR = fileURLToPath(new URL('../../../templates', import.meta.url));

export type MailTemplateName = 'invitation' | 'password-reset' | 'packet-sent' | 'signup-verification' | 'signup-notice';

export interface RenderedMail {
  subject: string;
  html: string;
  text: string;
}

/**
 * Renders `templates/mail/<name>/{subject,html,text}.hbs`. Templates hold no logic; Handlebars escapes
 * every value in the HTML part. The HTML part is wrapped in `templates/mail/layout.html.hbs`.
 */
@Injectable()
export class MailTemplates {
  private readonly cache = new Map<string, Handlebars.TemplateDelegate>();
  // The plain-text parts must not be HTML-escaped; a separate instance compiles them with noEscape.
  private readonly handlebars = Handlebars.create();

  render(name: MailTemplateName, data: Record<string, unknown>): RenderedMail {
    const subject = this.compile(`${name}/subject.hbs`, true)(data).trim();
    const body = this.compile(`${name}/html.hbs`, false)(data);
    const html = this.compile('layout.html.hbs', false)({ ...data, subject, body: new Handlebars.SafeString(body) });
    const text = this.compile(`${name}/text.hbs`, true)(data);
    return { subject, html, text };
  }

  private compile(file: string, noEscape: boolean): Handlebars.TemplateDelegate {
    const key = `${file}:${noEscape}`;
    let template = this.cache.get(key);
    if (!template) {
      const source = readFileSync(join(TEMPLATES_DIR, 'mail', file), 'utf8');
      template = this.handlebars.compile(source, { noEscape, strict: true });
      this.cache.set(key, template);
    }
    return template;
  }
}
