import type { Specification } from '../specification';
import { astmF1295, astmF136, astmF67 } from './titanium';
import { astmF138, astmF1537, astmF2063, iso58321 } from './other-alloys';

/** The specification library shipped with Ingotrace (the newest revision of each). */
export const specificationLibrary: readonly Specification[] = [
  astmF67,
  astmF136,
  astmF1295,
  astmF138,
  iso58321,
  astmF1537,
  astmF2063,
];

/** Finds a specification by its designation, without regard to case or spacing. */
export function findSpecification(id: string): Specification | undefined {
  const wanted = id.replace(/\s+/g, '').toUpperCase();
  return specificationLibrary.find((specification) => specification.id.replace(/\s+/g, '').toUpperCase() === wanted);
}
