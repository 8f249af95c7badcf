
// `npm run bench`: prints figures; targets are compared by a reader, never asserted. The whole-process
// comparison with the baseline script runs first, on an idle machine; the in-process benches after it,
// the engine's first: the others' modules (the database, fonts) would otherwise share its heap and slow
// its hot loop by a third.
const { benchWholeProcess } = await import('./whole-process.ts');
await benchWholeProcess();

const { benchEngineRefit } = await import('./engine-refit.ts');
const engine = benchEngineRefit();
console.log(
  `engine: ${Math.round(engine.refitsPerSecond).toLocaleString('en-US')} full refits/s ` +
    `(${engine.microsecondsPerRefit.toFixed(1)} µs each; 4 runs x 16 readings, both ln F models, exponential fit, second stage; one core; target >= 50,000/s)`,
);

const { benchChecks, benchCorpusChecks } = await import('./check-throughput.ts');
const checks = benchChecks();
console.log(
  `checker: ${Math.round(checks.checksPerSecond).toLocaleString('en-US')} checked submissions/s ` +
    `(${checks.microsecondsPerCheck.toFixed(1)} µs each; clean, 4 runs x 16 readings, default assignment, checkBatch over 2,000; one core)`,
);

const { benchTranspositionRecall } = await import('./transposition-recall.ts');
benchTranspositionRecall();

const mixed = await benchCorpusChecks();
console.log(
  `checker on the whole-process corpus: ${Math.round(mixed.checksPerSecond).toLocaleString('en-US')} checked submissions/s ` +
    `(${mixed.microsecondsPerCheck.toFixed(1)} µs each; 2,000 of its submissions, a third with slips whose causes are searched; one core, warm)`,
);

const { benchTemperatureRecall } = await import('./temperature-recall.ts');
benchTemperatureRecall();

const { benchReactionOrderRecall } = await import('./reaction-order-recall.ts');
benchReactionOrderRecall();

const { benchPdfs } = await import('./pdf-throughput.ts');
const pdfs = await benchPdfs();
console.log(
  `feedback sheets: ${pdfs.pdfsPerSecond.toFixed(0)} PDFs/s (${pdfs.millisecondsPerPdf.toFixed(1)} ms each, ` +
    `${pdfs.meanKilobytes.toFixed(0)} kB on average; ${pdfs.pagesNote}; one core; target >= 100/s)`,
);

const { benchBulkSubmit } = await import('./bulk-submit.ts');
await benchBulkSubmit();

const { benchConcurrentLoad } = await import('./concurrent-load.ts');
await benchConcurrentLoad();

const { benchResultsUnderLoad, printResultsUnderLoad } = await import('./results-under-load.ts');
printResultsUnderLoad(await benchResultsUnderLoad());

const { benchSignalRates } = await import('./signal-rates.ts');
benchSignalRates();

const { benchWorkspaceView } = await import('./workspace-view.ts');
await benchWorkspaceView();
