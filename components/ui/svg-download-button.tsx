'use client';

/**
 * Downloads the SVG element with the given id as a standalone .svg file: the drawing as shown, its legend
 * included (legends that belong in the file are drawn inside the SVG).
 */
export function SvgDownloadButton({
  targetId,
  filename,
  label,
}: {
  targetId: string;
  filename: string;
  /** The button's accessible name, naming the plot; it reads "Download SVG". */
  label: string;
}) {
  function download() {
    const svg = document.getElementById(targetId);
    if (!(svg instanceof SVGSVGElement)) return;
    const copy = svg.cloneNode(true) as SVGSVGElement;
    copy.setAttribute('xmlns', 'http://www.w3.org/2000/svg');
    const box = svg.viewBox.baseVal;
    // A file opened on its own has no page to size it: its viewBox size becomes its size.
    copy.setAttribute('width', String(box.width));
    copy.setAttribute('height', String(box.height));
    copy.removeAttribute('class');
    const text = `<?xml version="1.0" encoding="UTF-8"?>\n${new XMLSerializer().serializeToString(copy)}\n`;
    const url = URL.createObjectURL(new Blob([text], { type: 'image/svg+xml' }));
    const a = document.createElement('a');
    a.href = url;
    a.download = filename;
    document.body.append(a);
    a.click();
    a.remove();
    setTimeout(() => URL.revokeObjectURL(url), 1000);
  }
  return (
    <button type="button" className="gw-button-quiet px-2 py-1 text-xs" onClick={download} aria-label={label}>
      Download SVG
    </button>
  );
}
