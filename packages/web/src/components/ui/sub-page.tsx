import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';

interface SubPageProps {
  /** Where the back link goes: the page this one belongs to. */
  backTo: string;
  /** The back link's text, after its arrow. */
  backLabel: string;
  title: ReactNode;
  /** A line under the heading saying what the page shows. */
  intro?: ReactNode;
  children: ReactNode;
}

/** The frame of a page that belongs to another (a notebook's activity, its versions…): back link, heading, intro, content. */
export function SubPage({ backTo, backLabel, title, intro, children }: SubPageProps) {
  return (
    <section className="space-y-6">
      <div>
        <p className="text-sm">
          <Link to={backTo} className="text-accent underline-offset-2 hover:underline">
            ← {backLabel}
          </Link>
        </p>
        <h1 className="text-2xl font-semibold tracking-tight">{title}</h1>
        {intro ? <p className="text-ink-soft">{intro}</p> : null}
      </div>
      {children}
    </section>
  );
}
