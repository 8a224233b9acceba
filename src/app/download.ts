/** Saving files from the page: text files and PNG pictures of canvases. */

/** Offers `blob` to the person as a download named `name`. */
export function saveBlob(name: string, blob: Blob): void {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  a.rel = 'noopener';
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

export function saveText(name: string, text: string, type = 'text/plain'): void {
  saveBlob(name, new Blob([text], { type: `${type};charset=utf-8` }));
}

/**
 * A PNG of one or more canvases stacked vertically on a solid background, with an optional
 * title line above, at the canvases' own pixel size.
 */
export function canvasesToPng(canvases: HTMLCanvasElement[], background: string, ink: string, title?: string): Promise<Blob> {
  const pad = 12;
  const titleHeight = title ? 28 : 0;
  const width = Math.max(...canvases.map((c) => c.width)) + 2 * pad;
  const height = canvases.reduce((h, c) => h + c.height + pad, pad + titleHeight);
  const out = document.createElement('canvas');
  out.width = width;
  out.height = height;
  const ctx = out.getContext('2d') as CanvasRenderingContext2D;
  ctx.fillStyle = background;
  ctx.fillRect(0, 0, width, height);
  if (title) {
    ctx.fillStyle = ink;
    ctx.font = '600 16px system-ui, sans-serif';
    ctx.textBaseline = 'top';
    ctx.fillText(title, pad, pad);
  }
  let y = pad + titleHeight;
  for (const c of canvases) {
    ctx.drawImage(c, pad, y);
    y += c.height + pad;
  }
  return new Promise((resolve, reject) => out.toBlob((b) => (b ? resolve(b) : reject(new Error('the picture could not be made'))), 'image/png'));
}

/** A file name from free text: letters, digits, dot, dash and underscore only. */
export function fileSafe(text: string): string {
  return text.replace(/[^A-Za-z0-9._-]+/g, '_').replace(/^_+|_+$/g, '') || 'chart';
}
