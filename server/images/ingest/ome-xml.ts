import { omeLengthToMicrometres, type PixelSizeReading } from '../../../shared/pixel-size';

/**
 * Pixel size from OME-XML (the ImageDescription of an OME-TIFF's first IFD): the first
 * Pixels element's PhysicalSizeX/Y with their units. Null when the text is not OME-XML
 * or names no physical size; a reading with source `none` when the unit is unknown.
 */
export function pixelSizeFromOmeXml(description: string | undefined): PixelSizeReading | null {
  if (!description || !/<(\w+:)?OME[\s>]/.test(description)) return null;
  const pixels = /<(?:\w+:)?Pixels\b([^>]*)>/.exec(description);
  if (!pixels) return null;
  const attrs = new Map<string, string>();
  for (const m of pixels[1]!.matchAll(/([A-Za-z_][\w.-]*)\s*=\s*"([^"]*)"/g)) attrs.set(m[1]!, decodeEntities(m[2]!));
  const x = attrs.get('PhysicalSizeX');
  if (x === undefined) return null;
  const xUnit = attrs.get('PhysicalSizeXUnit');
  const xUm = omeLengthToMicrometres(Number(x), xUnit);
  const y = attrs.get('PhysicalSizeY');
  const yUm = y === undefined ? xUm : omeLengthToMicrometres(Number(y), attrs.get('PhysicalSizeYUnit'));
  const shown = `PhysicalSizeX ${x} ${xUnit ?? 'µm'}`;
  if (xUm === null || yUm === null) return { xUm: null, yUm: null, source: 'none', note: `The OME-XML pixel size (${shown}) has a unit or value Etchfile cannot read.` };
  return { xUm, yUm, source: 'ome_xml', note: `From the OME-XML in the file: ${shown}.` };
}

function decodeEntities(text: string): string {
  return text
    .replace(/&#x([0-9a-f]+);/gi, (_, h: string) => String.fromCodePoint(parseInt(h, 16)))
    .replace(/&#(\d+);/g, (_, d: string) => String.fromCodePoint(Number(d)))
    .replace(/&quot;/g, '"')
    .replace(/&apos;/g, "'")
    .replace(/&lt;/g, '<')
    .replace(/&gt;/g, '>')
    .replace(/&amp;/g, '&');
}
