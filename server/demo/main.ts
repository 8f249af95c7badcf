import { runDemo } from './run-demo.ts';

// `npm run demo`
await runDemo(process.argv[2]);
