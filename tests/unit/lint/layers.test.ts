import { ESLint } from 'eslint';
import { beforeAll, describe, expect, test } from 'vitest';

/**
 * The layer rules of eslint.config.js, run through ESLint itself (what `npm run lint` runs) on
 * small sources placed, by their path, in each layer.
 */
const eslint = new ESLint();

async function layerErrors(filePath: string, code: string): Promise<string[]> {
	const [result] = await eslint.lintText(code, { filePath });
	return result.messages.filter((m) => m.ruleId === 'no-restricted-imports').map((m) => m.message);
}

// Loading the config and its plugins takes seconds on a busy machine; once is enough.
beforeAll(() => layerErrors('src/lib/music/warm-up.ts', 'export {};\n'), 120_000);

describe('npm run lint keeps the layers apart', { timeout: 60_000 }, () => {
	test.each([
		['src/lib/practice/fixture.ts', "import { error } from '@sveltejs/kit';", /Kit/],
		['src/lib/practice/fixture.ts', "import { browser } from '$app/environment';", /\$app/],
		['src/lib/music/fixture.ts', "import { env } from '$env/dynamic/private';", /config\.ts/],
		['src/lib/music/fixture.ts', "import { Op } from 'sequelize';", /Sequelize/],
		['src/lib/practice/fixture.ts', "import { getDb } from '$lib/server/db/index';", /Server code/],
		[
			'src/lib/practice/fixture.ts',
			"import { User } from '../server/db/models/index';",
			/Server code/
		],
		['src/lib/forms/fixture.ts', "import { getConfig } from '../server/config';", /Server code/],
		[
			'src/lib/components/Fixture.ts',
			"import { load } from '../../routes/+layout.server';",
			/routes/
		]
	])('%s may not `%s`', async (filePath, code, message) => {
		const errors = await layerErrors(filePath, `${code}\nexport {};\n`);
		expect(errors).toHaveLength(1);
		expect(errors[0]).toMatch(message);
	});

	test.each([
		['src/lib/practice/fixture.ts', "import { z } from 'zod';"],
		['src/lib/practice/fixture.ts', "import { transpose } from '../music/index';"],
		['src/lib/server/study/fixture.ts', "import { Op } from 'sequelize';"],
		['src/routes/fixture.ts', "import { error } from '@sveltejs/kit';"]
	])('%s may `%s`', async (filePath, code) => {
		expect(await layerErrors(filePath, `${code}\nexport {};\n`)).toEqual([]);
	});
});
