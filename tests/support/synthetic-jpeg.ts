// Test helpers: pass a synthetic photo through a real JPEG encode and decode (sharp / libvips).
import sharp from "sharp";
import type { RawImage } from "@/colour/calibration";

export interface JpegOptions {
  /** JPEG quality (default 90, a common phone setting [practice]). */
  quality?: number;
  /** Chroma subsampling (default "4:2:0", as phone cameras store JPEGs [practice]). */
  chromaSubsampling?: "4:2:0" | "4:4:4";
}

/** Encode raw 8-bit RGB as a JPEG. */
export async function encodeJpeg(image: Pick<RawImage, "data" | "width" | "height">, options: JpegOptions = {}): Promise<Buffer> {
  return sharp(image.data, { raw: { width: image.width, height: image.height, channels: 3 } })
    .jpeg({ quality: options.quality ?? 90, chromaSubsampling: options.chromaSubsampling ?? "4:2:0" })
    .toBuffer();
}

/** Decode a JPEG to raw 8-bit RGB. */
export async function decodeJpeg(jpeg: Buffer): Promise<RawImage> {
  const { data, info } = await sharp(jpeg).removeAlpha().raw().toBuffer({ resolveWithObject: true });
  return { data: new Uint8Array(data.buffer, data.byteOffset, data.length), width: info.width, height: info.height, channels: info.channels };
}

/** The image after a JPEG round trip. */
export async function throughJpeg(image: Pick<RawImage, "data" | "width" | "height">, options: JpegOptions = {}): Promise<RawImage> {
  return decodeJpeg(await encodeJpeg(image, options));
}
