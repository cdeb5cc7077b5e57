import 'reflect-metadata';
import { ConfigService } from '@nestjs/config';
import { createApp } from './app.factory';
import type { AppConfig } from './config/configuration';
import { MailService } from './mail/mail.service';

async function main(): Promise<void> {
  const app = await createApp();
  const config = app.get(ConfigService<AppConfig, true>);
  const host = config.get('host', { infer: true });
  const port = config.get('port', { infer: true });
  try {
    await app.listen(port, host);
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'EADDRINUSE') {
      console.error(`[fieldbound] error: port ${port} on ${host} is already in use; set FIELDBOUND_PORT to choose another port.`);
      await app.close();
      process.exit(1);
    }
    throw error;
  }
  console.log(`[fieldbound] serving on http://${host}:${port}`);
  if (app.get(MailService).usesFake) {
    console.log(`[fieldbound] no FIELDBOUND_SMTP_URL: e-mail stays on this machine; read it at ${config.get('publicUrl', { infer: true })}/dev/mailbox`);
  }
}

void main();
