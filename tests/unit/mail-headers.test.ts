import { describe, expect, it } from 'vitest';
import { decodeHeader, unfoldHeaders } from '../../server/mail/mailer';

describe('fake SMTP header reading (RFC 5322 folding, RFC 2047 encoded words)', () => {
  it('joins a folded subject', () => {
    const raw = 'From: a@b\r\nSubject: HRL 4101 is non-complying: Front pilot, Pilot height\r\n above rail out of limit\r\nTo: c@d\r\n\r\nbody\r\n continues';
    expect(/^Subject: (.*)$/im.exec(unfoldHeaders(raw))![1]).toBe('HRL 4101 is non-complying: Front pilot, Pilot height above rail out of limit');
  });
  it('decodes Q and B encoded words', () => {
    expect(decodeHeader('=?UTF-8?Q?Marlow_Yard=3A_due_=E2=80=94_ok?=')).toBe('Marlow Yard: due — ok');
    expect(decodeHeader('=?UTF-8?B?w4lsZWN0cmlxdWU=?=')).toBe('Électrique');
    expect(decodeHeader('=?UTF-8?Q?a?= =?UTF-8?Q?b?=')).toBe('ab');
  });
});
