// `npx tsx test/bench/course-file.ts` (after `npm run build`): the course-wide file of `npm run bench`
// alone, `check --out` on 20,000 submissions with its peak memory, for a change to be weighed in minutes.
const { benchCourseFileAlone } = await import('./whole-process.ts');
await benchCourseFileAlone();
