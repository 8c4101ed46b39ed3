// Plain, accessible mail bodies. Every value is escaped: names and questions are user text.
export function escapeHtml(value: string): string {
  return value.replace(
    /[&<>"']/g,
    (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!,
  );
}

export function mailHtml(opts: {
  lang: string;
  paragraphs: string[];
  action?: { label: string; url: string };
  footer: string;
}): string {
  const body = opts.paragraphs.map((p) => `<p style="margin:0 0 12px">${escapeHtml(p)}</p>`).join("");
  const action = opts.action
    ? `<p style="margin:20px 0"><a href="${escapeHtml(opts.action.url)}" style="background:#1b4a35;color:#f8f5ec;padding:12px 18px;border-radius:8px;text-decoration:none;font-weight:bold">${escapeHtml(opts.action.label)}</a></p>`
    : "";
  return (
    `<!doctype html><html lang="${escapeHtml(opts.lang)}"><body style="font-family:system-ui,sans-serif;background:#f8f5ec;color:#1a1f1b;padding:24px">` +
    `<div style="max-width:560px;margin:auto">${body}${action}<p style="color:#3d463f;font-size:13px">${escapeHtml(opts.footer)}</p></div></body></html>`
  );
}
