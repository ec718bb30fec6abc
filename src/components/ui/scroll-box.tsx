import { useEffect, useRef, useState, type ReactNode } from 'react';

/**
 * A box that scrolls wide content (a table) sideways on a narrow screen instead of widening the
 * page. `relative` makes it the containing block of absolutely positioned content (sr-only
 * labels), so that is clipped too. While it actually scrolls it is a labelled, focusable region,
 * so it can be scrolled from the keyboard (WCAG 2.1.1; axe "scrollable-region-focusable"); when
 * everything fits it adds no tab stop. Every table that may be wider than its column goes in one
 * (DataTable does it itself), so no page needs its own scroll wrapper.
 */
export function ScrollBox({ label, className = '', children }: { label: string; className?: string; children: ReactNode }) {
  const ref = useRef<HTMLDivElement>(null);
  const [scrolls, setScrolls] = useState(false);
  useEffect(() => {
    const el = ref.current;
    if (!el || typeof ResizeObserver === 'undefined') return;
    const check = () => setScrolls(el.scrollWidth > el.clientWidth + 1);
    check();
    const ro = new ResizeObserver(check);
    ro.observe(el);
    if (el.firstElementChild) ro.observe(el.firstElementChild);
    return () => ro.disconnect();
  }, []);
  return (
    // The focus outline is drawn inside the box: a parent with overflow-hidden (rounded tables)
    // would clip one drawn outside it.
    <div
      ref={ref}
      className={`relative overflow-x-auto focus-visible:-outline-offset-2 ${className}`}
      {...(scrolls ? { tabIndex: 0, role: 'region', 'aria-label': `${label} (scrolls sideways)` } : {})}
    >
      {children}
    </div>
  );
}
