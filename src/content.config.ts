import { defineCollection, z } from 'astro:content';
import { glob } from 'astro/loaders';

const records = defineCollection({
  loader: glob({ pattern: '**/*.md', base: './content/records' }),
  schema: z.object({
    title: z.string(),
    author: z.string(),
    // YAML reads 2026-11-30 as a date; pages show it as written.
    date: z.coerce.date().transform((d: Date) => d.toISOString().slice(0, 10)),
    tags: z.array(z.string()).default([]),
  }),
});

export const collections = { records };
