/**
 * Loads and renders the handlebars templates shipped in the package's `templates/` folder.
 *
 * The folder is found relative to this module (`import.meta.url`), so the same code works from
 * `src/io/` under vitest and from `dist/io/` after `npm ci`: both sit two levels below the
 * package root. Every `.hbs` file in `templates/partials/` is registered as a partial under its
 * file name without the extension. Each render uses its own handlebars environment, so nothing
 * registered here leaks into other users of the library.
 *
 * Escaping convention: templates print user text with `{{ }}` (escaped). Triple braces `{{{ }}}`
 * are reserved for SVG produced by vega, which escapes text marks itself (tested in
 * tests/io/charts.test.ts).
 */
import { readdir, readFile } from 'node:fs/promises';
import { fileURLToPath } from 'node:url';
import Handlebars from 'handlebars';

/** Absolute path of the package's `templates/` folder, with a trailing separator. */
function templatesDirectory(): string {
  return fileURLToPath(new URL('../../templates/', import.meta.url));
}

async function templateEnvironment(): Promise<typeof Handlebars> {
  const environment = Handlebars.create();
  const partialsDirectory = `${templatesDirectory()}partials/`;
  let names: string[] = [];
  try {
    names = (await readdir(partialsDirectory)).filter((name) => name.endsWith('.hbs'));
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'ENOENT') throw error;
  }
  for (const name of names.sort()) {
    const source = await readFile(`${partialsDirectory}${name}`, 'utf8');
    environment.registerPartial(name.slice(0, -'.hbs'.length), source);
  }
  // The only logic templates need: numbering from 1 and a simple equality test.
  environment.registerHelper('plusOne', (value: number) => value + 1);
  environment.registerHelper('eq', (a: unknown, b: unknown) => a === b);
  return environment;
}

/**
 * Renders `templates/<name>.hbs` with `context`. `strict` makes a missing field an error
 * instead of an empty string, so a renamed view-model field cannot silently blank a sheet.
 */
export async function renderTemplate(name: string, context: object): Promise<string> {
  const environment = await templateEnvironment();
  const source = await readFile(`${templatesDirectory()}${name}.hbs`, 'utf8');
  const template = environment.compile(source, { strict: true });
  return template(context);
}
