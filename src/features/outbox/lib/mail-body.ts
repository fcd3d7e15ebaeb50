/**
 * The readable text of a raw RFC 5322 message as the local SMTP server kept it: the part after the
 * headers, with quoted-printable (RFC 2045 §6.7) or base64 transfer encoding undone.
 */
export function mailBody(raw: string): string {
  const norm = raw.replace(/\r\n/g, '\n');
  const split = norm.indexOf('\n\n');
  if (split < 0) return norm;
  const head = norm.slice(0, split);
  let body = norm.slice(split + 2);
  // A multipart message: take its first text/plain part.
  const boundary = /boundary="?([^";\n]+)"?/i.exec(head)?.[1];
  if (boundary && /content-type:\s*multipart\//i.test(head)) {
    const parts = body.split(`--${boundary}`).slice(1);
    const plain = parts.find((p) => /content-type:\s*text\/plain/i.test(p)) ?? parts[0];
    if (plain) return mailBody(plain.replace(/^\n/, ''));
  }
  const enc = /^content-transfer-encoding:\s*([^\s;]+)/im.exec(head)?.[1]?.toLowerCase();
  if (enc === 'quoted-printable') body = decodeQuotedPrintable(body);
  else if (enc === 'base64') body = decodeUtf8(Uint8Array.from(atob(body.replace(/\s+/g, '')), (c) => c.charCodeAt(0)));
  return body.replace(/\n+$/, '');
}

export function decodeQuotedPrintable(s: string): string {
  const soft = s.replace(/=\n/g, '');
  const bytes: number[] = [];
  for (let i = 0; i < soft.length; i++) {
    const c = soft[i];
    const hex = soft.slice(i + 1, i + 3);
    if (c === '=' && /^[0-9A-Fa-f]{2}$/.test(hex)) {
      bytes.push(parseInt(hex, 16));
      i += 2;
    } else {
      for (const b of new TextEncoder().encode(c)) bytes.push(b);
    }
  }
  return decodeUtf8(Uint8Array.from(bytes));
}

const decodeUtf8 = (b: Uint8Array) => new TextDecoder('utf-8').decode(b);
