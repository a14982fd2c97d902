import { createServer, type Server, type Socket } from 'node:net';

import type { ConfigService } from '@nestjs/config';
import { afterEach, describe, expect, it } from 'vitest';

import type { Env } from '../config/env.schema.js';
import type { LocalSmtpServer } from './local-smtp.server.js';
import { MailTemplates } from './mail-templates.js';
import { MailService } from './mail.service.js';

function configOf(values: Partial<Env>): ConfigService<Env, true> {
  return { get: (key: keyof Env) => values[key] } as unknown as ConfigService<Env, true>;
}

describe(MailService.name, () => {
  let silent: Server | undefined;
  const sockets: Socket[] = [];

  afterEach(async () => {
    for (const socket of sockets) socket.destroy();
    await new Promise<void>((resolve) => (silent ? silent.close(() => resolve()) : resolve()));
    silent = undefined;
  });

  describe('send', () => {
    // nodemailer's own default is to wait 30 s for a greeting (and 2 min for a connection); an SMTP
    // server that accepts the connection and then says nothing must not hold a send that long.
    it('should give up on a server that never greets after SMTP_GREETING_TIMEOUT_MS', async () => {
      silent = createServer((socket) => sockets.push(socket));
      await new Promise<void>((resolve) => silent!.listen(0, '127.0.0.1', resolve));
      const { port } = silent.address() as { port: number };
      const sut = new MailService(
        configOf({
          SMTP_URL: `smtp://127.0.0.1:${port}`,
          MAIL_FROM: 'Loamline <no-reply@loamline.example>',
          SMTP_CONNECTION_TIMEOUT_MS: 300,
          SMTP_GREETING_TIMEOUT_MS: 300,
          SMTP_SOCKET_TIMEOUT_MS: 1000,
        }),
        new MailTemplates(),
        {} as LocalSmtpServer,
      );

      // Without the limit this would wait out nodemailer's 30 s and fail on the test's own timeout.
      await expect(
        sut.send({
          template: 'password-reset',
          to: 'someone@mail-timeout.example',
          companyId: '00000000-0000-4000-8000-000000000000',
          data: { name: 'Someone', companyName: 'Fernhollow Sound', link: 'https://loamline.example/reset-password?token=x', minutes: 60 },
        }),
      ).rejects.toThrow(/greeting|timeout/i);
    });
  });
});
