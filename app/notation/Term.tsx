import type { ReactNode } from 'react';

/**
 * A name with a short explanation, shown on hover and on keyboard focus (by `TermTip`): a phase
 * label, a channel, an order-parameter group, a symbol. Focusable, so the explanation is
 * reachable with Tab.
 */
export function Term({
  explain,
  children,
  className,
  testId,
}: {
  readonly explain: string | null;
  readonly children: ReactNode;
  readonly className?: string;
  readonly testId?: string;
}) {
  if (explain === null) return <>{children}</>;
  return (
    <span
      className={className ? `term ${className}` : 'term'}
      tabIndex={0}
      data-explain={explain}
      data-testid={testId}
    >
      {children}
    </span>
  );
}
