import AxeBuilder from '@axe-core/playwright';
import { expect, type Page } from '@playwright/test';

/** WCAG 2.2 A and AA violations on the page as it is now (`target-size` included), one line each. */
export async function accessibilityViolations(page: Page): Promise<string[]> {
	const results = await new AxeBuilder({ page })
		.withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'])
		.analyze();
	return results.violations.map(
		(v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(' ')).join(', ')})`
	);
}

/** Fails the test on any WCAG 2.2 A or AA violation on the page as it is now. */
export async function expectAccessible(page: Page): Promise<void> {
	expect(await accessibilityViolations(page), 'accessibility violations').toEqual([]);
}
