import { defineCollection, z } from 'astro:content';
import { RECORDS_FOLDER } from './site/records-folder.ts';
import { recordFiles } from './site/records-loader.ts';

// Only the file is known here; title, author, date and tags come from groundwork's own reading of each record.
const records = defineCollection({
  loader: recordFiles(RECORDS_FOLDER),
  schema: z.object({ file: z.string() }),
});

export const collections = { records };
