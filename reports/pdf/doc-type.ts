/** The drawing surface every block draws on: its own file, so the text helpers need not import the page layout. */
export type Doc = PDFKit.PDFDocument;
