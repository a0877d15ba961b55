import { listAnswer } from '$lib/server/build-list-route';

/** The build's activity log, 50 entries a page, newest first: `next` reaches back to the first entry. */
export async function GET(event) {
	return listAnswer(event, 'activity');
}
