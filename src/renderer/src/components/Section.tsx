// A titled block of the side panel and of the views (a title, an optional note at its right, the content).
import type { ReactNode } from 'react';

export function Section(props: { title: string; right?: ReactNode; children: ReactNode; testId?: string }) {
  return (
    <section className="section" data-testid={props.testId}>
      <h3>
        {props.title}
        {props.right && <span className="right">{props.right}</span>}
      </h3>
      <div className="content">{props.children}</div>
    </section>
  );
}
