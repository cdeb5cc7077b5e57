/**
 * E-mail addresses mentioned as `@name@example.org` in plain text, lower-cased and without repeats.
 * The `@` must start the text or follow a character that cannot be part of an address, so an ordinary
 * address ("write to a@b.org") is not a mention.
 */
export function mentionedEmails(text: string): string[] {
  const found = new Set<string>();
  const pattern = /(?:^|[^A-Za-z0-9._%+@-])@([A-Za-z0-9._%+-]+@[A-Za-z0-9-]+(?:\.[A-Za-z0-9-]+)*\.[A-Za-z]{2,})/g;
  for (const match of text.matchAll(pattern)) found.add(match[1].toLowerCase().replace(/\.+$/, ''));
  return [...found];
}
