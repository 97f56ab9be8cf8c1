import { Fragment } from 'react';

const URL_PATTERN = /(https?:\/\/[^\s<>"']+)/g;
const TRAILING_PUNCTUATION = /[.,;:!?)\]]+$/;

/**
 * Plain text with its http(s) URLs turned into links. The message's HTML part is never
 * injected into the page; the text part carries the same links.
 */
export function LinkifiedText({ text }: { text: string }) {
  const parts = text.split(URL_PATTERN);
  return (
    <>
      {parts.map((part, index) => {
        if (index % 2 === 0) return <Fragment key={index}>{part}</Fragment>;
        const trailing = part.match(TRAILING_PUNCTUATION)?.[0] ?? '';
        const href = trailing ? part.slice(0, -trailing.length) : part;
        return (
          <Fragment key={index}>
            <a href={href} className="break-all text-primary underline underline-offset-2 hover:text-primary/80">
              {href}
            </a>
            {trailing}
          </Fragment>
        );
      })}
    </>
  );
}
