/**
 * Boxes that scroll inside the page (a wide table in `.overflow-x-auto`, a
 * long list in `.overflow-auto`, a code block) must be reachable by keyboard,
 * or someone without a mouse cannot see what is cut off (WCAG 2.1.1). A box
 * becomes a Tab stop only while it really overflows and holds nothing
 * focusable itself; when it fits again the Tab stop goes. A box whose markup
 * sets its own tabindex is left as it is.
 *
 * One watcher for the whole document, so every scroll box, present and future,
 * follows the same rule without each page remembering it.
 */

/** The classes app.css already treats as scroll boxes, plus preformatted text. */
const SCROLL_BOX = '.overflow-x-auto, .overflow-auto, .overflow-y-auto, pre';
const FOCUSABLE = 'a[href], button, input, select, textarea, summary, [tabindex]:not([tabindex="-1"])';
/** Marks a tabindex this module set, so it is never mistaken for the markup's own. */
const MARK = 'scrollStop';

function overflows(box: HTMLElement): boolean {
	// One pixel of slack: sub-pixel table widths round up without anything being hidden.
	return box.scrollWidth > box.clientWidth + 1 || box.scrollHeight > box.clientHeight + 1;
}

function update(box: HTMLElement) {
	const ours = box.dataset[MARK] === 'yes';
	if (box.hasAttribute('tabindex') && !ours) return;
	const needsStop = overflows(box) && box.querySelector(FOCUSABLE) === null;
	if (needsStop && !ours) {
		box.tabIndex = 0;
		box.dataset[MARK] = 'yes';
	} else if (!needsStop && ours) {
		box.removeAttribute('tabindex');
		delete box.dataset[MARK];
	}
}

/** Starts watching `root`; answers the function that stops. */
export function keepScrollBoxesReachable(root: HTMLElement): () => void {
	const watched = new Set<HTMLElement>();
	const resizes = new ResizeObserver((entries) => {
		for (const entry of entries) update(entry.target as HTMLElement);
	});
	let pending = 0;
	function scan() {
		pending = 0;
		for (const box of watched) {
			if (box.isConnected) continue;
			resizes.unobserve(box);
			watched.delete(box);
		}
		for (const box of root.querySelectorAll<HTMLElement>(SCROLL_BOX)) {
			if (!watched.has(box)) {
				watched.add(box);
				resizes.observe(box);
			}
			update(box);
		}
	}
	// Content that grows inside a box of fixed size changes nothing a ResizeObserver sees: rescan on changes, once a frame.
	const mutations = new MutationObserver(() => {
		if (pending === 0) pending = requestAnimationFrame(scan);
	});
	mutations.observe(root, { childList: true, subtree: true });
	scan();
	return () => {
		mutations.disconnect();
		resizes.disconnect();
		watched.clear();
		if (pending !== 0) cancelAnimationFrame(pending);
	};
}
