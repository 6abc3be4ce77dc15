import { asc } from 'drizzle-orm';
import { alloys } from '../../../db/schema';
import { db } from './db';

export interface AlloySummary {
  slug: string;
  name: string;
  family: string;
  uns: string | null;
}

/** The alloy catalogue, in catalogue order. */
export async function listAlloys(): Promise<AlloySummary[]> {
  return db().select({ slug: alloys.slug, name: alloys.name, family: alloys.family, uns: alloys.uns }).from(alloys).orderBy(asc(alloys.id));
}
