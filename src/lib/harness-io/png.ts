// PNG of the drawing, made in the browser: the standalone SVG (svg.ts) is loaded as an image
// and drawn onto a canvas at a chosen scale, then encoded by the canvas (HTML Standard,
// HTMLCanvasElement.toBlob). Browser only.

/** Canvases above about 16 000 px a side fail in some browsers; large drawings are scaled down to fit. */
const MAX_SIDE = 12_000;

export async function svgToPng(svg: string, scale = 2): Promise<Blob> {
	const size = /<svg[^>]*\swidth="([\d.]+)"[^>]*\sheight="([\d.]+)"/.exec(svg);
	if (!size) throw new Error('svgToPng: the SVG has no width and height');
	const width = Number(size[1]);
	const height = Number(size[2]);
	const s = Math.min(scale, MAX_SIDE / width, MAX_SIDE / height);
	const url = URL.createObjectURL(new Blob([svg], { type: 'image/svg+xml' }));
	try {
		const image = new Image();
		image.decoding = 'async';
		image.src = url;
		await image.decode();
		const canvas = document.createElement('canvas');
		canvas.width = Math.max(1, Math.round(width * s));
		canvas.height = Math.max(1, Math.round(height * s));
		const ctx = canvas.getContext('2d');
		if (!ctx) throw new Error('svgToPng: no 2D canvas in this browser');
		ctx.drawImage(image, 0, 0, canvas.width, canvas.height);
		return await new Promise<Blob>((resolve, reject) =>
			canvas.toBlob((b) => (b ? resolve(b) : reject(new Error('svgToPng: the browser could not encode the PNG'))), 'image/png')
		);
	} finally {
		URL.revokeObjectURL(url);
	}
}

/** Offers a file to the user as a download. */
export function download(name: string, data: Blob | string, type = 'application/octet-stream'): void {
	const blob = typeof data === 'string' ? new Blob([data], { type }) : data;
	const url = URL.createObjectURL(blob);
	const a = document.createElement('a');
	a.href = url;
	a.download = name;
	document.body.append(a);
	a.click();
	a.remove();
	setTimeout(() => URL.revokeObjectURL(url), 10_000);
}
