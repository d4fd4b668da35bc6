/// <reference types="astro/client" />
import { relative } from 'node:path';
import type { ReviewLinks } from '../render/review-html.ts';
import { RECORDS_FOLDER } from './records-folder.ts';

const base = (): string => import.meta.env.BASE_URL ?? '/';

/** The page name of a record under records/ (as the loader names it), from its file relative to the log root. */
export const recordId = (file: string) => relative(RECORDS_FOLDER, file).split('\\').join('/').replace(/\.md$/, '');

/** Addresses of record and system pages under the site's base URL. */
export const siteLinks: ReviewLinks = {
  record: (file, block) => `${base()}records/${recordId(file)}/${block ? `#block-${block}` : ''}`,
  system: (slug) => `${base()}systems/${slug}/`,
};
