import { useEffect, useState } from 'react';
import './notation.css';

/** Id of the one explanation box of the page (the shown term is described by it). */
export const TERM_TIP_ID = 'term-tip';

/** Widest explanation box, CSS pixels (the stylesheet's max-width). */
const TIP_WIDTH = 320;

interface Tip {
  readonly text: string;
  readonly left: number;
  readonly top: number;
  /** Above the term (no room below it). */
  readonly above: boolean;
}

function explained(target: EventTarget | null): HTMLElement | SVGElement | null {
  return target instanceof Element
    ? (target.closest('[data-explain]') as HTMLElement | SVGElement | null)
    : null;
}

/**
 * The explanation box of every element with `data-explain` (a `Term`, a legend row, a lattice
 * key), one for the page: it follows the pointer's hover and the keyboard's focus, sits below
 * the element (above it near the bottom of the window), and the element is described by it
 * (`aria-describedby`) while it shows. Mount once.
 */
export function TermTip() {
  const [tip, setTip] = useState<Tip | null>(null);
  useEffect(() => {
    let current: HTMLElement | SVGElement | null = null;
    const show = (el: HTMLElement | SVGElement, again = false) => {
      if (current === el && !again) return;
      current?.removeAttribute('aria-describedby');
      current = el;
      el.setAttribute('aria-describedby', TERM_TIP_ID);
      const box = el.getBoundingClientRect();
      const above = box.bottom + 90 > window.innerHeight && box.top > 90;
      setTip({
        text: el.getAttribute('data-explain') ?? '',
        left: Math.max(4, Math.min(box.left, window.innerWidth - TIP_WIDTH - 8)),
        top: above ? box.top - 4 : box.bottom + 4,
        above,
      });
    };
    const hide = () => {
      current?.removeAttribute('aria-describedby');
      current = null;
      setTip(null);
    };
    const onOver = (event: Event) => {
      const el = explained(event.target);
      if (el !== null) show(el);
    };
    const onOut = (event: MouseEvent | FocusEvent) => {
      const el = explained(event.target);
      if (el === null || el !== current) return;
      const next = event.relatedTarget;
      if (next instanceof Node && el.contains(next)) return;
      // Keyboard focus keeps its explanation while the pointer passes by.
      if (event.type === 'mouseout' && el.contains(document.activeElement)) return;
      hide();
    };
    document.addEventListener('mouseover', onOver);
    document.addEventListener('focusin', onOver);
    document.addEventListener('mouseout', onOut);
    document.addEventListener('focusout', onOut);
    // A scroll moves the term: a focused one (Tab scrolls it into view) keeps its explanation,
    // placed anew; one under the pointer loses it.
    const onScroll = () => {
      if (current !== null && current.contains(document.activeElement)) show(current, true);
      else hide();
    };
    window.addEventListener('scroll', onScroll, true);
    return () => {
      document.removeEventListener('mouseover', onOver);
      document.removeEventListener('focusin', onOver);
      document.removeEventListener('mouseout', onOut);
      document.removeEventListener('focusout', onOut);
      window.removeEventListener('scroll', onScroll, true);
    };
  }, []);
  if (tip === null) return null;
  return (
    <div
      id={TERM_TIP_ID}
      role="tooltip"
      className={tip.above ? 'term-tip term-tip-above' : 'term-tip'}
      data-testid="term-tip"
      style={{ left: tip.left, top: tip.top }}
    >
      {tip.text}
    </div>
  );
}
