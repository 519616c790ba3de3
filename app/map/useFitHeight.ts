import { useLayoutEffect, useState, type RefObject } from 'react';

/**
 * The height from an element's top (in the page, whatever the scroll) to the bottom of the
 * window, less `reserve` CSS pixels kept for what follows it; followed as the window and the
 * layout above the element change. Infinity before the first measure.
 */
export function useFitHeight(ref: RefObject<HTMLElement | null>, reserve: number): number {
  const [height, setHeight] = useState(Infinity);
  useLayoutEffect(() => {
    const element = ref.current;
    if (!element) return;
    const measure = () => {
      const top = element.getBoundingClientRect().top + window.scrollY;
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
