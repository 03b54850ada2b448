/** Tiny DOM helpers: build elements without a framework. */

type Child = Node | string | null | undefined | false;

export function h<K extends keyof HTMLElementTagNameMap>(
  tag: K,
  attrs: Record<string, string | number | boolean | ((ev: Event) => void) | undefined> = {},
  ...children: Child[]
): HTMLElementTagNameMap[K] {
  const el = document.createElement(tag);
  for (const [k, v] of Object.entries(attrs)) {
    if (v === undefined || v === false) continue;
    if (typeof v === 'function') el.addEventListener(k.replace(/^on/, ''), v);
    else if (k === 'class') el.className = String(v);
    else if (k === 'text') el.textContent = String(v);
    else if (v === true) el.setAttribute(k, '');
    else el.setAttribute(k, String(v));
  }
  for (const c of children) if (c !== null && c !== undefined && c !== false) el.append(c);
  return el;
}

export function clear(el: Element): void {
  while (el.firstChild) el.removeChild(el.firstChild);
}

/**
 * A panel's render that does not run again inside itself: clearing a panel removes a focused field,
 * which fires its change handler, which updates the store and would render again mid-render.
 */
export function reentrySafe(renderNow: () => void): () => void {
  let rendering = false;
  return () => {
    if (rendering) return;
    rendering = true;
    try {
      renderNow();
    } finally {
      rendering = false;
    }
  };
}

export function fmt(v: number, digits = 0): string {
  if (v === Infinity) return '∞';
  if (!Number.isFinite(v)) return '—';
  return v.toLocaleString('en-GB', { maximumFractionDigits: digits, minimumFractionDigits: digits });
}

export function download(name: string, bytes: ArrayBuffer | Uint8Array | string, type = 'application/octet-stream'): void {
  const blob = new Blob([bytes as BlobPart], { type });
  const url = URL.createObjectURL(blob);
  const a = h('a', { href: url, download: name });
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}
