/**
 * A map image for reports: the map canvas with a title, the legend, a scale bar and the caution,
 * drawn onto one 2-D canvas and returned as PNG bytes. Everything is drawn locally.
 */

import type maplibregl from 'maplibre-gl';

export async function renderMapImage(map: maplibregl.Map, opts: { title: string; subtitle: string; legend: HTMLElement }): Promise<Blob> {
  await new Promise<void>((resolve) => {
    map.once('render', () => resolve());
    map.triggerRepaint();
  });
  const src = map.getCanvas();
  const legendW = 300;
  const pad = 16;
  const W = src.width + legendW;
  const H = Math.max(src.height, 520) + 70;
  const c = document.createElement('canvas');
  c.width = W;
  c.height = H;
  const g = c.getContext('2d')!;
  g.fillStyle = '#ffffff';
  g.fillRect(0, 0, W, H);
  g.drawImage(src, 0, 50);
  g.fillStyle = '#111';
  g.font = 'bold 18px "DejaVu Sans", sans-serif';
  g.fillText(opts.title, pad, 24);
  g.font = '13px "DejaVu Sans", sans-serif';
  g.fillText(opts.subtitle, pad, 42);

  // scale bar from the map's resolution at the centre (Web Mercator: m/px = C·cos φ / 2^(z+9) at 512 tiles)
  const lat = map.getCenter().lat;
  const dpr = src.width / map.getContainer().clientWidth;
  const mPerPx = (40075016.686 * Math.cos((lat * Math.PI) / 180)) / Math.pow(2, map.getZoom() + 9) / dpr;
  const target = 150 * mPerPx;
  const nice = [1, 2, 5].flatMap((m) => [1, 10, 100, 1000, 10000, 100000].map((p) => m * p)).filter((v) => v <= target).pop() ?? 1;
  const px = nice / mPerPx;
  const y0 = 50 + src.height - 24;
  g.fillStyle = 'rgba(255,255,255,0.85)';
  g.fillRect(pad - 6, y0 - 18, px + 80, 30);
  g.fillStyle = '#111';
  g.fillRect(pad, y0, px, 4);
  g.fillText(nice >= 1000 ? `${nice / 1000} km` : `${nice} m`, pad + px + 8, y0 + 6);

  // legend: text of each legend row, with its swatch colour when it has one
  let y = 70;
  const x = src.width + pad;
  g.font = 'bold 14px "DejaVu Sans", sans-serif';
  g.fillText('Legend', x, y);
  y += 20;
  g.font = '12px "DejaVu Sans", sans-serif';
  for (const row of Array.from(opts.legend.children) as HTMLElement[]) {
    if (y > H - 60) break;
    const sw = row.querySelector('.swatch') as HTMLElement | null;
    const line = row.querySelector('line');
    const ramp = row.classList.contains('ramp') ? getComputedStyle(row).backgroundImage : null;
    if (ramp) {
      const grad = g.createLinearGradient(x, 0, x + 200, 0);
      const stops = [...ramp.matchAll(/rgb\((\d+), (\d+), (\d+)\) (\d+)%/g)];
      for (const s of stops) grad.addColorStop(Number(s[4]) / 100, `rgb(${s[1]},${s[2]},${s[3]})`);
      g.fillStyle = grad;
      g.fillRect(x, y - 10, 200, 12);
      g.fillStyle = '#111';
      y += 18;
      continue;
    }
    if (sw) {
      g.fillStyle = getComputedStyle(sw).backgroundColor;
      g.fillRect(x, y - 10, 24, 12);
    } else if (line) {
      g.strokeStyle = line.getAttribute('stroke') ?? '#000';
      g.lineWidth = Number(line.getAttribute('stroke-width') ?? 2);
      const dash = line.getAttribute('stroke-dasharray');
      g.setLineDash(dash ? dash.split(' ').map(Number) : []);
      g.beginPath();
      g.moveTo(x, y - 4);
      g.lineTo(x + 24, y - 4);
      g.stroke();
      g.setLineDash([]);
    }
    g.fillStyle = '#111';
    const text = row.textContent ?? '';
    g.fillText(text.length > 40 ? text.slice(0, 39) + '…' : text, x + (sw || line ? 30 : 0), y);
    y += 18;
  }
  g.font = '11px "DejaVu Sans", sans-serif';
  g.fillStyle = '#333';
  g.fillText('Interpretation from depth grids and stated parameters (Taperline). Decisions rest with qualified professionals and local rules.', pad, H - 12);
  return await new Promise<Blob>((resolve) => c.toBlob((b) => resolve(b!), 'image/png'));
}
