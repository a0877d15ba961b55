import { z } from 'zod';

export const buildLimits = { name: 120, engine: 500 } as const;

export const buildName = z
	.string({ error: 'name: required' })
	.trim()
	.min(1, { error: `name: 1 to ${buildLimits.name} characters` })
	.max(buildLimits.name, { error: `name: 1 to ${buildLimits.name} characters` });

export const createBuild = z.object({
	name: buildName,
	engine: z
		.string()
		.trim()
		.max(buildLimits.engine, { error: `engine: at most ${buildLimits.engine} characters` })
		.optional()
		.default('')
});

export const renameBuild = z.object({ buildId: z.uuid({ error: 'buildId: a build id' }), name: buildName });

export const buildId = z.object({ buildId: z.uuid({ error: 'buildId: a build id' }) });
