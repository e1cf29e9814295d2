import { createRequire } from 'node:module';
import type { Page } from 'playwright-core';

/**
 * The phone-and-desktop audit of one rendered page (issue 17). Layout rules run inside the page;
 * accessibility rules come from axe-core, injected as a script (the test context bypasses the CSP).
 *
 * Sizes: WCAG 2.2 SC 2.5.5 "Target Size (Enhanced)" asks 44×44 CSS px (we hold phones to it) and
 * SC 2.5.8 "Target Size (Minimum)" 24×24 everywhere. 2.5.8's "inline" exception (a link inside a
 * sentence, sized by the line height) applies here to inline links whose block holds more text than
 * the link itself; 2.5.8's spacing exception is not used (stricter than the standard).
 */
export const PHONE = { width: 375, height: 812 } as const;
export const DESKTOP = { width: 1280, height: 800 } as const;
export const PHONE_MIN_TARGET = 44;
export const MIN_TARGET = 24;

export type Finding = { rule: string; detail: string };

const require = createRequire(import.meta.url);
const AXE_PATH = require.resolve('axe-core/axe.min.js');

/** Runs the layout rules in the page: sideways scrolling, clipped boxes, primary cells off-screen, small targets, hidden focus. */
export async function auditLayout(page: Page, minTarget: number): Promise<Finding[]> {
  return page.evaluate((min) => {
    const findings: { rule: string; detail: string }[] = [];
    const describe = (el: Element) => {
      const text = (el.textContent ?? '').replace(/\s+/g, ' ').trim().slice(0, 40);
      const label = el.getAttribute('aria-label') ?? '';
      const cls = typeof el.className === 'string' ? el.className.split(' ').slice(0, 3).join('.') : '';
      return `<${el.tagName.toLowerCase()}${cls ? '.' + cls : ''}> "${label || text}"`;
    };
    const visible = (el: Element) => {
      if (el.getClientRects().length === 0) return false;
      const style = getComputedStyle(el);
      return style.visibility !== 'hidden' && style.display !== 'none';
    };
    const viewport = document.documentElement.clientWidth;

    // 1. The document never scrolls sideways.
    if (document.documentElement.scrollWidth > viewport + 1) {
      // Name the culprits: boxes that reach past the right edge while their parent does not.
      const culprits = Array.from(document.body.querySelectorAll('*'))
        .filter((el) => {
          const parent = el.parentElement;
          return (
            el.getBoundingClientRect().right > viewport + 1 && parent && parent.getBoundingClientRect().right <= viewport + 1
          );
        })
        .slice(0, 3)
        .map(describe);
      findings.push({
        rule: 'page-scrolls-sideways',
        detail: `document ${document.documentElement.scrollWidth} px > ${viewport} px: ${culprits.join(', ')}`,
      });
    }

    for (const el of Array.from(document.body.querySelectorAll('*'))) {
      if (!visible(el)) continue;
      const style = getComputedStyle(el);
      // 2. No element scrolls sideways, and nothing is cut off by a box that hides its overflow.
      if (el.scrollWidth > el.clientWidth + 1 && el.clientWidth > 2) {
        if (style.overflowX === 'auto' || style.overflowX === 'scroll')
          findings.push({ rule: 'element-scrolls-sideways', detail: `${describe(el)} ${el.scrollWidth} > ${el.clientWidth} px` });
        else if ((style.overflowX === 'hidden' || style.overflowX === 'clip') && style.textOverflow !== 'ellipsis')
          findings.push({ rule: 'element-clipped', detail: `${describe(el)} ${el.scrollWidth} > ${el.clientWidth} px` });
      }
    }

    // 3. Cells of the columns a table marks primary lie inside the viewport.
    for (const cell of Array.from(document.querySelectorAll('[data-primary]'))) {
      if (!visible(cell)) continue;
      const r = cell.getBoundingClientRect();
      if (r.left < -1 || r.right > viewport + 1)
        findings.push({
          rule: 'primary-cell-off-screen',
          detail: `${describe(cell)} at ${Math.round(r.left)}–${Math.round(r.right)} px`,
        });
    }

    // 4. Interactive elements are large enough; a hidden input is measured by its label.
    const selector =
      'a[href], button, input:not([type=hidden]), select, textarea, summary, [role=button], [role=link], [role=tab], [role=switch], [tabindex]:not([tabindex="-1"])';
    const labelOf = (el: Element): Element | null =>
      el.closest('label') ?? (el.id ? document.querySelector(`label[for="${CSS.escape(el.id)}"]`) : null);
    for (const el of Array.from(document.querySelectorAll(selector))) {
      if ((el as HTMLButtonElement).disabled || el.closest('[inert]')) continue;
      let target: Element = el;
      let r = el.getBoundingClientRect();
      const hiddenInput = el.tagName === 'INPUT' && r.width <= 2 && r.height <= 2;
      const input = el as HTMLInputElement;
      if (hiddenInput || (el.tagName === 'INPUT' && (input.type === 'checkbox' || input.type === 'radio'))) {
        const label = labelOf(el);
        if (label && visible(label)) {
          target = label;
          const lr = label.getBoundingClientRect();
          if (lr.width * lr.height > r.width * r.height) r = lr;
        }
      }
      if (!visible(target) && !hiddenInput) continue;
      // A visually hidden control (e.g. "Skip to content" until focused) is not a target until it shows.
      if (!hiddenInput && r.width <= 2 && r.height <= 2) continue;
      if (el.tagName === 'A' && getComputedStyle(el).display === 'inline') {
        const block = el.parentElement?.closest('p, li, td, th, div, dd, span');
        const own = (el.textContent ?? '').trim().length;
        const around = (block?.textContent ?? '').trim().length;
        if (around > own + 8) continue; // WCAG 2.5.8 inline exception: a link inside a sentence
      }
      if (r.width + 0.5 < min || r.height + 0.5 < min)
        findings.push({
          rule: 'target-too-small',
          detail: `${describe(target)} ${Math.round(r.width)}×${Math.round(r.height)} px (min ${min})`,
        });
    }

    // 5. A visually hidden input (file pickers) shows its focus on its label (WCAG 2.4.7).
    for (const el of Array.from(document.querySelectorAll('input'))) {
      const r = el.getBoundingClientRect();
      if (r.width > 2 || r.height > 2 || el.type === 'hidden' || el.disabled) continue;
      const label = labelOf(el);
      if (!label) {
        findings.push({ rule: 'hidden-input-without-label', detail: describe(el) });
        continue;
      }
      // The label or something inside it (the visible "button") must change its outline or shadow.
      const parts = [label, ...Array.from(label.querySelectorAll('*'))].filter((e) => e !== el);
      const look = () => parts.map((e) => `${getComputedStyle(e).outlineStyle}|${getComputedStyle(e).boxShadow}`).join(';');
      const idle = look();
      el.focus({ focusVisible: true } as FocusOptions);
      const focused = look();
      el.blur();
      if (focused === idle)
        findings.push({ rule: 'focus-not-visible', detail: `${describe(label)} shows no focus for its hidden input` });
    }
    return findings;
  }, minTarget);
}

type AxeResult = { violations: { id: string; impact: string | null; help: string; nodes: { target: unknown[] }[] }[] };

/** axe-core's serious and critical violations on the page as it stands. */
export async function auditAccessibility(page: Page): Promise<Finding[]> {
  const hasAxe = await page.evaluate(() => 'axe' in window);
  if (!hasAxe) await page.addScriptTag({ path: AXE_PATH });
  const result = (await page.evaluate(() =>
    (window as unknown as { axe: { run(ctx: Document, o: object): Promise<unknown> } }).axe.run(document, {
      resultTypes: ['violations'],
    }),
  )) as AxeResult;
  return result.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => ({
      rule: `axe:${v.id}`,
      detail: `${v.help} — ${v.nodes
        .slice(0, 4)
        .map((n) => JSON.stringify(n.target))
        .join(', ')}${v.nodes.length > 4 ? ` (+${v.nodes.length - 4})` : ''}`,
    }));
}
