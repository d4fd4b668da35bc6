// @ts-check
import { defineConfig } from 'astro/config';
import rehypeKatex from 'rehype-katex';
import remarkMath from 'remark-math';
import remarkVariational from './src/remark/remark-variational.ts';

export default defineConfig({
  output: 'static',
  outDir: './dist',
  markdown: {
    remarkPlugins: [remarkMath, [remarkVariational, { root: process.cwd() }]],
    rehypePlugins: [rehypeKatex],
  },
});
