import { createRequire } from 'node:module';
import { dirname } from 'node:path';
import pdfmake from 'pdfmake';
import type { TDocumentDefinitions } from 'pdfmake/interfaces';

const require = createRequire(import.meta.url);
/** Full Noto Sans TTFs shipped with the app (WOFF2 subsets lose accented letters in PDFs). */
const font = (file: string) => require.resolve(`@expo-google-fonts/noto-sans/${file}`);
const fonts = {
  NotoSans: {
    normal: font('400Regular/NotoSans_400Regular.ttf'),
    bold: font('700Bold/NotoSans_700Bold.ttf'),
    italics: font('400Regular_Italic/NotoSans_400Regular_Italic.ttf'),
    bolditalics: font('700Bold_Italic/NotoSans_700Bold_Italic.ttf'),
  },
};
const fontDir = dirname(dirname(fonts.NotoSans.normal));
let configured = false;

function configure(): void {
  if (configured) return;
  pdfmake.addFonts(fonts);
  // Documents never fetch anything: no URLs, and only the shipped fonts from disk.
  pdfmake.setUrlAccessPolicy(() => false);
  pdfmake.setLocalAccessPolicy((path: string) => path.startsWith(fontDir));
  configured = true;
}

/** Renders a document; the same definition (with its fixed creation date) gives the same bytes. */
export async function renderPdf(definition: TDocumentDefinitions): Promise<Buffer> {
  configure();
  const document = pdfmake.createPdf({
    ...definition,
    defaultStyle: { font: 'NotoSans', fontSize: 9, ...definition.defaultStyle },
  });
  return Buffer.from(await document.getBuffer());
}
