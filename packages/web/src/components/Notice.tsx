import {
  Callout,
  type CalloutProps,
  NonIdealState,
  type NonIdealStateProps,
} from '@blueprintjs/core';
import { createElement, type ReactNode } from 'react';

type HeadingLevel = 1 | 2 | 3;

/**
 * A title that reads as a heading: a real heading at the level the page needs (the page's own
 * title, or a section), else a heading-styled paragraph. Blueprint gives callout titles h5 and
 * empty-state titles h4 whatever the page, which leaves the page's headings skipping levels.
 */
function Title({ level, children }: { level?: HeadingLevel; children: ReactNode }) {
  return createElement(
    level ? `h${level}` : 'p',
    { className: 'bp6-heading cairn-notice-title' },
    children,
  );
}

export interface NoticeProps extends Omit<CalloutProps, 'title'> {
  title?: ReactNode;
  /** Make the title a heading of this level (by default it is not one) */
  headingLevel?: HeadingLevel;
}

/** A callout (Blueprint's) whose title fits the page's headings. */
export function Notice({ title, headingLevel, children, ...props }: NoticeProps) {
  return (
    <Callout {...props}>
      {title ? <Title level={headingLevel}>{title}</Title> : null}
      {children}
    </Callout>
  );
}

export interface EmptyStateProps extends Omit<NonIdealStateProps, 'title'> {
  title?: ReactNode;
  /** Make the title a heading of this level (1 when the state is the whole page) */
  headingLevel?: HeadingLevel;
}

/** A page or panel with nothing to show (Blueprint's non-ideal state), its title fitting the page. */
export function EmptyState({ title, headingLevel, description, ...props }: EmptyStateProps) {
  return (
    <NonIdealState
      {...props}
      description={
        title || description ? (
          <div>
            {title ? <Title level={headingLevel}>{title}</Title> : null}
            {description ? <div>{description}</div> : null}
          </div>
        ) : undefined
      }
    />
  );
}
