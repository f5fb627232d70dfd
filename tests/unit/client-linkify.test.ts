import { describe, expect, it } from 'vitest';
import { splitLinks } from '../../src/lib/linkify.js';

describe('splitLinks', () => {
  it('when the text has no link, returns it whole', () => {
    expect(splitLinks('Hello,\nno links here.')).toEqual([{ kind: 'text', text: 'Hello,\nno links here.' }]);
  });

  it('finds an invitation link on its own line', () => {
    const parts = splitLinks('Open the link:\n\nhttp://localhost:3000/invitations/abc_DEF-123\n\n— Planewright');
    expect(parts).toEqual([
      { kind: 'text', text: 'Open the link:\n\n' },
      { kind: 'link', text: 'http://localhost:3000/invitations/abc_DEF-123', href: 'http://localhost:3000/invitations/abc_DEF-123' },
      { kind: 'text', text: '\n\n— Planewright' },
    ]);
  });

  it('when a sentence ends right after the link, leaves the full stop out of it', () => {
    const parts = splitLinks('Reset at https://pw.example.org/reset-password?token=x1.');
    expect(parts[1]).toEqual({ kind: 'link', text: 'https://pw.example.org/reset-password?token=x1', href: 'https://pw.example.org/reset-password?token=x1' });
    expect(parts[2]).toEqual({ kind: 'text', text: '.' });
  });

  it('keeps a closing bracket that belongs to the address', () => {
    const parts = splitLinks('see https://example.org/a_(b) now');
    expect(parts[1]).toMatchObject({ kind: 'link', href: 'https://example.org/a_(b)' });
  });

  it('leaves a bracket that only closes the sentence outside the link', () => {
    const parts = splitLinks('(at https://example.org/x)');
    expect(parts[1]).toMatchObject({ kind: 'link', href: 'https://example.org/x' });
    expect(parts[2]).toEqual({ kind: 'text', text: ')' });
  });

  it('never turns other schemes into links', () => {
    expect(splitLinks('javascript:alert(1) data:text/html,x').every((p) => p.kind === 'text')).toBe(true);
  });

  it('finds several links', () => {
    expect(splitLinks('http://a.example.org and https://b.example.org').filter((p) => p.kind === 'link')).toHaveLength(2);
  });
});
