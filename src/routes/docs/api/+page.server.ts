import { openApiDocument } from '$lib/server/openapi/document';
import { apiView } from '$lib/server/openapi/view';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = () => {
	const document = openApiDocument();
	return {
		groups: apiView(document),
		server: (document.servers as { url: string }[])[0]!.url,
		intro: (document.info as { description: string }).description,
		signingIn: (document.components as { securitySchemes: { session: { description: string } } }).securitySchemes.session.description
	};
};
