import { expect, type Locator } from '@playwright/test';

/** Fails when any two visible fields inside the container overlap on screen (a field spilling into its neighbour). */
export async function expectNoOverlappingFields(container: Locator, what: string): Promise<void> {
  const boxes = await container.locator('input:visible, textarea:visible, .p-select:visible').evaluateAll((elements) =>
    elements.map((element) => {
      const rect = element.getBoundingClientRect();
      return {
        id: element.id || element.getAttribute('aria-label') || element.className,
        left: rect.left,
        right: rect.right,
        top: rect.top,
        bottom: rect.bottom,
      };
    }),
  );
  const overlaps: string[] = [];
  for (let a = 0; a < boxes.length; a++) {
    for (let b = a + 1; b < boxes.length; b++) {
      const [one, two] = [boxes[a]!, boxes[b]!];
      const apart =
        one.right <= two.left + 1 ||
        two.right <= one.left + 1 ||
        one.bottom <= two.top + 1 ||
        two.bottom <= one.top + 1;
      if (!apart) overlaps.push(`${one.id} × ${two.id}`);
    }
  }
  expect(overlaps, `fields overlapping in ${what}`).toEqual([]);
}
