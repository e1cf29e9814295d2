/**
 * Whether a text holds something a mail reader would take for a link: a scheme (`http://`,
 * `mailto:`), `www.`, an e-mail address, or a domain-like word (`example.com`, `bit.ly/x`). Such
 * text must not reach an invitation e-mail, which would carry it to an address of the sender's
 * choosing (issue 13 #5: a squad named "Account locked - verify at http://… now").
 */
export function looksLikeLink(text: string): boolean {
  const t = text.toLowerCase();
  if (/[a-z][a-z0-9+.-]*:\/\//.test(t) || /\b(?:mailto|tel|javascript|data):/.test(t)) return true;
  if (/\bwww\d?\./.test(t) || /\S@\S+\.\S/.test(t)) return true;
  // A word, a dot, then two or more letters: a domain ("harbor.run", "x.co/abc"); "St. Kilda" has a space.
  return /[a-z0-9-]\.[a-z]{2,}\b/.test(t);
}

export const NO_LINKS_IN_SQUAD_NAME =
  'A squad name cannot hold a web or e-mail address: it goes into invitation e-mails. Use the squad’s plain name.';
