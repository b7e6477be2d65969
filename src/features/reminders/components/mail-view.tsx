import { useId, useState } from 'react';
import { cn } from '@/lib/cn';

/**
 * Links open in a new tab, as in a mail program, instead of inside the frame. Added to the
 * document the frame shows, never to the stored message.
 */
export function withLinksInNewTab(html: string): string {
  const base = '<base target="_blank">';
  if (/<head[^>]*>/i.test(html)) return html.replace(/<head[^>]*>/i, (m) => `${m}${base}`);
  return `${base}${html}`;
}

/**
 * A message as a person reads it: the HTML part in a sandboxed frame (no scripts, no same-origin
 * access: the frame cannot reach Rowpath or run anything), and the plain-text part beside it.
 */
export function MailView({ html, text, title, frameHeight = 620 }: { html: string | null; text: string | null; title: string; frameHeight?: number }) {
  const [part, setPart] = useState<'html' | 'text'>(html ? 'html' : 'text');
  const id = useId();
  const tabs = [
    { id: 'html' as const, label: 'As e-mail', disabled: !html },
    { id: 'text' as const, label: 'Plain text', disabled: !text },
  ];
  return (
    <div>
      <div role="tablist" aria-label={`${title}: part`} className="flex gap-1 border-b-2 border-loam-200">
        {tabs.map((tab) => (
          <button
            key={tab.id}
            type="button"
            role="tab"
            id={`${id}-tab-${tab.id}`}
            aria-selected={part === tab.id}
            aria-controls={`${id}-panel-${tab.id}`}
            disabled={tab.disabled}
            tabIndex={part === tab.id ? 0 : -1}
            onClick={() => setPart(tab.id)}
            onKeyDown={(event) => {
              if (event.key === 'ArrowRight' || event.key === 'ArrowLeft') {
                event.preventDefault();
                const next = part === 'html' ? 'text' : 'html';
                if (!tabs.find((t) => t.id === next)?.disabled) setPart(next);
                document.getElementById(`${id}-tab-${next}`)?.focus();
              }
            }}
            className={cn(
              '-mb-0.5 inline-flex min-h-11 items-center border-b-4 px-3 font-semibold disabled:opacity-50',
              part === tab.id ? 'border-ink-700 text-ink-900' : 'border-transparent text-loam-700 hover:text-ink-800',
            )}
          >
            {tab.label}
          </button>
        ))}
      </div>
      <div id={`${id}-panel-html`} role="tabpanel" aria-labelledby={`${id}-tab-html`} hidden={part !== 'html'} className="pt-3">
        {html ? (
          <iframe
            title={title}
            sandbox="allow-popups allow-popups-to-escape-sandbox"
            srcDoc={withLinksInNewTab(html)}
            referrerPolicy="no-referrer"
            data-mail-html
            className="w-full rounded-lg border border-loam-300 bg-loam-100"
            style={{ height: frameHeight }}
          />
        ) : (
          <p className="text-loam-700">This message has no HTML part.</p>
        )}
      </div>
      <div id={`${id}-panel-text`} role="tabpanel" aria-labelledby={`${id}-tab-text`} hidden={part !== 'text'} className="pt-3">
        {text ? (
          <pre data-mail-text className="max-h-[620px] overflow-auto rounded-lg border border-loam-300 bg-white p-4 font-sans text-base leading-relaxed whitespace-pre-wrap text-ink-950">
            {text}
          </pre>
        ) : (
          <p className="text-loam-700">This message has no plain-text part.</p>
        )}
      </div>
    </div>
  );
}
