import { download } from '../screens/catalogue/CsvTransfer';

/** Save an SVG element as a stand-alone .svg file. */
export function saveSvg(svg: SVGSVGElement, name: string): void {
  const text = '<?xml version="1.0" encoding="UTF-8"?>\n' + new XMLSerializer().serializeToString(svg);
  download(name, text, 'image/svg+xml');
}

/** Save an SVG element as PNG at twice its size (for print), through a canvas. */
export async function savePng(svg: SVGSVGElement, name: string): Promise<void> {
  const text = new XMLSerializer().serializeToString(svg);
  const url = URL.createObjectURL(new Blob([text], { type: 'image/svg+xml' }));
  try {
    const img = new Image();
    await new Promise<void>((resolve, reject) => {
      img.onload = () => resolve();
      img.onerror = () => reject(new Error('the chart could not be drawn as an image'));
      img.src = url;
    });
    const scale = 2;
    const canvas = document.createElement('canvas');
    canvas.width = svg.width.baseVal.value * scale;
    canvas.height = svg.height.baseVal.value * scale;
    const ctx = canvas.getContext('2d')!;
    ctx.scale(scale, scale);
    ctx.drawImage(img, 0, 0);
    const blob = await new Promise<Blob>((resolve, reject) =>
      canvas.toBlob((b) => (b ? resolve(b) : reject(new Error('the chart could not be saved as PNG'))), 'image/png'),
    );
    download(name, blob, 'image/png');
  } finally {
    URL.revokeObjectURL(url);
  }
}
