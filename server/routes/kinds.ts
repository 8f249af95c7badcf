import { kindDescriptions } from '../../kinds/registry.ts';
import { KindList } from '../../schemas/api/kinds.ts';
import { defineRoute } from '../http/route-table.ts';

export const kindRoutes = [
  defineRoute({
    method: 'GET',
    url: '/v1/kinds',
    // Public: the kinds' descriptions hold nothing of a course or a person, and the students' pages
    // draw their hand-in form from them as the staff's draw the settings form.
    access: 'public',
    summary: "The experiment kinds an assignment can be, as the workspace draws them: each kind's quantities with their symbols, its settings form's fields with defaults and bounds, the files an upload takes, its finding codes in a few words and the words of its signals",
    schema: { response: { 200: KindList } },
    async handler() {
      return kindDescriptions();
    },
  }),
];
