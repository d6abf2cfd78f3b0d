// One content collection of plain markdown pages, read from the folder the benchmark writes.
import { defineCollection } from 'astro:content';
import { glob } from 'astro/loaders';

export const collections = {
  pages: defineCollection({ loader: glob({ pattern: '**/*.md', base: process.env.BASELINE_CONTENT ?? './content' }) }),
};
