import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import nodemailer from 'nodemailer';
import { call, registerAccount } from '../../test/http';
import { startTestApp, type TestApp } from '../../test/test-app';
import { MailFake } from './mail-fake';
import { decodeEncodedWords, decodeQuotedPrintable, extractLinks, parseMessage } from './mime';
import { invitationMail } from './templates';

describe('MIME reading for the mail fake', () => {
  it('decodes quoted-printable with soft line breaks and UTF-8 bytes', () => {
    expect(decodeQuotedPrintable('Caf=C3=A9 au=\r\n lait =3D ok')).toBe('Café au lait = ok');
  });

  it('decodes encoded-word subjects in Q and B forms', () => {
    expect(decodeEncodedWords('=?UTF-8?Q?Join_Groupe_=C3=89lectrons?=')).toBe('Join Groupe Électrons');
    expect(decodeEncodedWords(`=?UTF-8?B?${Buffer.from('Ωmega').toString('base64')}?=`)).toBe('Ωmega');
  });

  it('finds the text and HTML parts of a multipart/alternative message', () => {
    const raw = [
      'Subject: Hello',
      'Content-Type: multipart/alternative; boundary="b1"',
      '',
      '--b1',
      'Content-Type: text/plain; charset=utf-8',
      'Content-Transfer-Encoding: base64',
      '',
      Buffer.from('Open https://example.test/x?y=1 now').toString('base64'),
      '--b1',
      'Content-Type: text/html',
      '',
      '<p>Hi</p>',
      '--b1--',
    ].join('\r\n');
    const parsed = parseMessage(raw);
    expect(parsed.subject).toBe('Hello');
    expect(parsed.text).toBe('Open https://example.test/x?y=1 now');
    expect(parsed.html).toBe('<p>Hi</p>');
    expect(extractLinks(parsed.text!)).toEqual(['https://example.test/x?y=1']);
  });
});

describe('MailFake over real SMTP', () => {
  const fake = new MailFake();
  beforeAll(async () => {
    await fake.start(0);
  });
  afterAll(async () => {
    await fake.stop();
  });

  it('captures a message sent by nodemailer, with recipients, decoded subject, text and a long link intact', async () => {
    const transport = nodemailer.createTransport({ host: '127.0.0.1', port: fake.port, secure: false, ignoreTLS: true });
    const link = `http://127.0.0.1:3000/invitations/${crypto.randomUUID()}.${'Z'.repeat(43)}`;
    const mail = invitationMail({ to: 'Émile@Example.test', teamName: 'Groupe Électrons', inviterName: 'Marie', role: 'viewer', link, expiresAt: new Date('2027-01-01T00:00:00Z') });
    await transport.sendMail({ from: 'a@b.test', ...mail });
    transport.close();
    const [message] = fake.list();
    expect(message.to).toEqual(['émile@example.test']);
    expect(message.subject).toBe('Join Groupe Électrons on Fieldbound');
    expect(message.links).toContain(link);
    expect(message.text).toContain('as a viewer');
    expect(message.html).toContain('Groupe Électrons');
  });
});

describe('GET /dev/mailbox', () => {
  let server: TestApp;
  beforeAll(async () => {
    server = await startTestApp();
  });
  afterAll(async () => {
    await server.close();
  });

  it('lists captured messages newest first while the fake is in use, without needing a session', async () => {
    const account = await registerAccount(server, 'mailbox');
    await call(server, 'POST', '/auth/forgot-password', { body: { email: account.email } });
    let messages: { to: string[]; subject: string }[] = [];
    for (let i = 0; i < 100 && !messages.some((m) => m.to.includes(account.email)); i++) {
      messages = (await call(server, 'GET', '/dev/mailbox')).body.messages;
      await new Promise((r) => setTimeout(r, 20));
    }
    expect(messages[0]).toMatchObject({ to: [account.email], subject: 'Reset your Fieldbound password' });
  });
});

describe('real SMTP from FIELDBOUND_SMTP_URL', () => {
  const relay = new MailFake();
  let server: TestApp;
  beforeAll(async () => {
    await relay.start(0);
    server = await startTestApp({ mail: { smtpUrl: `smtp://127.0.0.1:${relay.port}?ignoreTLS=true`, from: 'Fieldbound <robot@lab.test>', fakePort: 0 } });
  });
  afterAll(async () => {
    await server.close();
    await relay.stop();
  });

  it('sends through the configured server, and /dev/mailbox answers 404', async () => {
    const account = await registerAccount(server, 'relay');
    await call(server, 'POST', '/auth/forgot-password', { body: { email: account.email } });
    for (let i = 0; i < 100 && !relay.list().length; i++) await new Promise((r) => setTimeout(r, 20));
    expect(relay.list()[0]).toMatchObject({ from: 'robot@lab.test', to: [account.email], subject: 'Reset your Fieldbound password' });
    const mailbox = await call(server, 'GET', '/dev/mailbox');
    expect(mailbox.status).toBe(404);
    expect(mailbox.body.code).toBe('mailbox_unavailable');
  });
});
