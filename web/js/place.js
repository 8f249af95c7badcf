/**
 * @import { MyCourse } from '../../schemas/api/me.ts'
 */
/**
 * The section and assignment a view shows, and their course, as the caller's listing names them.
 * Its own module so that the panels a section view holds can name it without importing the view.
 * @typedef {{ course: MyCourse, section: MyCourse['sections'][number], assignment: MyCourse['assignments'][number] }} Place
 */
export {};
