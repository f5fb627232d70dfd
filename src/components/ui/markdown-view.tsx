import Markdown, { defaultUrlTransform, type Components } from 'react-markdown';
import { cn } from './cn.js';

/**
 * Only http(s), mailto and in-page or in-app links survive; anything else (javascript:, data:,
 * vbscript:) becomes an empty href, so the text stays but goes nowhere.
 */
export function safeUrl(url: string): string {
  const cleaned = defaultUrlTransform(url.trim());
  if (!cleaned) return '';
  if (/^(https?:|mailto:)/i.test(cleaned) || /^[/#?]/.test(cleaned) || !/^[a-z][a-z0-9+.-]*:/i.test(cleaned)) return cleaned;
  return '';
}

function isExternal(href: string): boolean {
  return /^https?:\/\//i.test(href);
}

const components: Components = {
  a: ({ href, children }) => {
    if (!href) return <span>{children}</span>;
    return isExternal(href) ? (
      <a href={href} target="_blank" rel="noopener noreferrer nofollow">
        {children}
        <span className="sr-only"> (opens in a new tab)</span>
      </a>
    ) : (
      <a href={href}>{children}</a>
    );
  },
  // Pictures from elsewhere are not fetched into the page (they could track readers); the text
  // links to them instead.
  img: ({ src, alt }) => {
    const href = typeof src === 'string' ? safeUrl(src) : '';
    const label = alt ? `Picture: ${alt}` : 'Picture';
    return href ? (
      <a href={href} target="_blank" rel="noopener noreferrer nofollow">
        {label}
      </a>
    ) : (
      <span>{label}</span>
    );
  },
  h1: ({ children }) => <h2 className="mt-6 text-xl font-semibold first:mt-0">{children}</h2>,
  h2: ({ children }) => <h3 className="mt-5 text-lg font-semibold first:mt-0">{children}</h3>,
  h3: ({ children }) => <h4 className="mt-4 font-semibold first:mt-0">{children}</h4>,
  h4: ({ children }) => <h5 className="mt-4 font-semibold first:mt-0">{children}</h5>,
  p: ({ children }) => <p className="my-3 first:mt-0 last:mb-0">{children}</p>,
  ul: ({ children }) => <ul className="my-3 list-disc space-y-1 pl-6">{children}</ul>,
  ol: ({ children }) => <ol className="my-3 list-decimal space-y-1 pl-6">{children}</ol>,
  blockquote: ({ children }) => <blockquote className="my-3 border-l-2 border-rule-strong pl-4 text-ink-soft">{children}</blockquote>,
  code: ({ children }) => <code className="rounded bg-paper-sunk px-1 py-0.5 font-mono text-[0.85em]">{children}</code>,
  pre: ({ children }) => <pre className="my-3 overflow-x-auto rounded-md bg-paper-sunk p-3 font-mono text-sm">{children}</pre>,
  hr: () => <hr className="my-5 border-rule" />,
  table: ({ children }) => (
    <div className="my-3 overflow-x-auto">
      <table className="border-collapse text-sm">{children}</table>
    </div>
  ),
  th: ({ children }) => <th className="border border-rule px-2 py-1 text-left font-semibold">{children}</th>,
  td: ({ children }) => <td className="border border-rule px-2 py-1">{children}</td>,
};

/**
 * Renders a brief's markdown. Raw HTML in the source is dropped (never rendered), links are
 * limited to safe schemes and open outside links in a new tab without handing over the page.
 * Headings shift down one level so the page's own h1 stays the only one.
 */
export function MarkdownView({ source, className }: { source: string; className?: string }) {
  return (
    <div className={cn('max-w-prose leading-relaxed text-ink', className)}>
      <Markdown skipHtml urlTransform={safeUrl} components={components}>
        {source}
      </Markdown>
    </div>
  );
}
