import { useLayoutEffect, useState, type RefObject } from 'react';

/**
 * The height of what comes and goes above an element (marked `data-fit-ignore`: the notice
 * line), so that a notice shown or dismissed does not resize what fits the window under it.
 */
function transientAbove(element: HTMLElement): number {
  const top = element.getBoundingClientRect().top;
  let sum = 0;
  for (const other of document.querySelectorAll<HTMLElement>('[data-fit-ignore]')) {
    const box = other.getBoundingClientRect();
    // Its top margin merges with the one above it; its bottom margin is its own.
    if (box.bottom <= top) sum += box.height + parseFloat(getComputedStyle(other).marginBottom);
  }
  return sum;
}

/**
 * The height from an element's top (in the page, whatever the scroll) to the bottom of the
 * window, less `reserve` CSS pixels kept for what follows it; followed as the window and the
 * layout above the element change. A notice line above it (`data-fit-ignore`) is not counted:
 * it pushes the element down (the page scrolls) instead of shrinking it. Infinity before the
 * first measure.
 */
export function useFitHeight(ref: RefObject<HTMLElement | null>, reserve: number): number {
  const [height, setHeight] = useState(Infinity);
  useLayoutEffect(() => {
    const element = ref.current;
    if (!element) return;
    const measure = () => {
      const top = element.getBoundingClientRect().top + window.scrollY - transientAbove(element);
      setHeight(Math.floor(window.innerHeight - top - reserve));
    };
    measure();
    window.addEventListener('resize', measure);
    // The layout above it (the masthead wrapping, a notice line) moves it down or up.
    const observer = new ResizeObserver(measure);
    observer.observe(document.body);
    return () => {
      window.removeEventListener('resize', measure);
      observer.disconnect();
    };
  }, [ref, reserve]);
  return height;
}
