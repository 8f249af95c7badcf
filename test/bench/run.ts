import { benchChecks } from './check-throughput.ts';
import { benchEngineRefit } from './engine-refit.ts';
import { benchPdfs } from './pdf-throughput.ts';
import { benchBulkSubmit } from './bulk-submit.ts';

// `npm run bench`: prints figures; targets are compared by a reader, never asserted.
const engine = benchEngineRefit();
console.log(
  `engine: ${Math.round(engine.refitsPerSecond).toLocaleString('en-US')} full refits/s ` +
    `(${engine.microsecondsPerRefit.toFixed(1)} µs each; 4 runs x 16 readings, both ln F models, exponential fit, second stage; one core; target >= 50,000/s)`,
);

const checks = benchChecks();
console.log(
  `checker: ${Math.round(checks.checksPerSecond).toLocaleString('en-US')} checked submissions/s ` +
    `(${checks.microsecondsPerCheck.toFixed(1)} µs each; clean, 4 runs x 16 readings, default assignment, checkBatch over 2,000; one core)`,
);

await benchBulkSubmit();

const pdfs = await benchPdfs();
console.log(
  `feedback sheets: ${pdfs.pdfsPerSecond.toFixed(0)} PDFs/s (${pdfs.millisecondsPerPdf.toFixed(1)} ms each, ` +
    `${pdfs.meanKilobytes.toFixed(0)} kB on average; ${pdfs.pagesNote}; one core; target >= 100/s)`,
);
