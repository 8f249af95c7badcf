// Stands in for student-view.js while that file is rewritten, so that app.js's import of it is typed
// without checking it: the lead deletes this file when re-including student-view.js in tsconfig.web.json.
import type { Failure } from './api.js';
import type { Place } from './section-view.js';

export function studentView(place: Place, submissionId: number, failure: Failure): Promise<HTMLElement>;
