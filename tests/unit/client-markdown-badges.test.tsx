// @vitest-environment jsdom
import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, render, screen } from '@testing-library/react';
import { AuditStateBadge, SeverityBadge } from '../../src/components/ui/audit-state-badge.js';
import { MarkdownView, safeUrl } from '../../src/components/ui/markdown-view.js';

afterEach(cleanup);

function renderMarkdown(source: string): HTMLElement {
  const { container } = render(<MarkdownView source={source} />);
  return container;
}

describe('MarkdownView', () => {
  it('renders headings, emphasis and lists, with headings one level down so the page keeps one h1', () => {
    const root = renderMarkdown('# Lantern\n\nUse **3 mm** birch.\n\n- one\n- two');
    expect(root.querySelector('h1')).toBeNull();
    expect(root.querySelector('h2')?.textContent).toBe('Lantern');
    expect(root.querySelector('strong')?.textContent).toBe('3 mm');
    expect(root.querySelectorAll('li').length).toBe(2);
  });

  it('never renders raw HTML from the source', () => {
    const root = renderMarkdown('Before <script>window.bad = 1</script><img src=x onerror="alert(1)"> <b>bold</b> after');
    expect(root.querySelector('script')).toBeNull();
    expect(root.querySelector('img')).toBeNull();
    expect(root.querySelector('b')).toBeNull();
    expect(root.innerHTML).not.toContain('onerror');
  });

  it('drops javascript: and data: links but keeps their text', () => {
    const root = renderMarkdown('[run](javascript:alert(1)) and [data](data:text/html,hi) and [home](/studios/1)');
    const links = Array.from(root.querySelectorAll('a'));
    expect(links.map((a) => a.getAttribute('href'))).toEqual(['/studios/1']);
    expect(root.textContent).toContain('run');
    expect(root.textContent).toContain('data');
  });

  it('opens outside links in a new tab without handing over the page', () => {
    const root = renderMarkdown('[rules](https://example.org/rules)');
    const a = root.querySelector('a')!;
    expect(a.getAttribute('target')).toBe('_blank');
    expect(a.getAttribute('rel')).toBe('noopener noreferrer nofollow');
  });

  it('shows pictures as links instead of loading them', () => {
    const root = renderMarkdown('![the bed](https://example.org/bed.png)');
    expect(root.querySelector('img')).toBeNull();
    expect(root.querySelector('a')?.textContent).toBe('Picture: the bed');
  });

  it('safeUrl keeps http(s), mailto and in-app paths only', () => {
    expect(safeUrl('https://example.org/a')).toBe('https://example.org/a');
    expect(safeUrl('mailto:ada@example.org')).toBe('mailto:ada@example.org');
    expect(safeUrl('/briefs/2')).toBe('/briefs/2');
    expect(safeUrl('javascript:alert(1)')).toBe('');
    expect(safeUrl(' JAVASCRIPT:alert(1)')).toBe('');
    expect(safeUrl('vbscript:x')).toBe('');
    expect(safeUrl('data:text/html,x')).toBe('');
  });
});

describe('AuditStateBadge and SeverityBadge', () => {
  it('names each audit state in words and gives each its own mark', () => {
    const marks = new Set<string>();
    for (const [state, label] of [
      ['queued', 'Queued'],
      ['running', 'Running'],
      ['done', 'Done'],
      ['failed', 'Failed'],
    ] as const) {
      const { container } = render(<AuditStateBadge state={state} detail={state === 'done' ? '2 errors' : undefined} />);
      const badge = container.querySelector('[data-audit-state]')!;
      expect(badge.getAttribute('data-audit-state')).toBe(state);
      expect(badge.textContent).toContain(`Audit ${label}`);
      marks.add(badge.querySelector('svg')!.innerHTML);
      cleanup();
    }
    expect(marks.size).toBe(4);
  });

  it('adds the detail after the state', () => {
    render(<AuditStateBadge state="done" detail="2 errors" />);
    expect(screen.getByText(/2 errors/)).toBeTruthy();
  });

  it('names each severity in words and gives each its own mark', () => {
    const marks = new Set<string>();
    for (const [severity, label] of [
      ['error', 'Error'],
      ['warning', 'Warning'],
      ['info', 'Info'],
    ] as const) {
      const { container } = render(<SeverityBadge severity={severity} />);
      const badge = container.querySelector('[data-severity]')!;
      expect(badge.textContent).toBe(label);
      marks.add(badge.querySelector('svg')!.innerHTML);
      cleanup();
    }
    expect(marks.size).toBe(3);
  });
});
