import { useCallback, useEffect, useRef, useState } from 'react';

/** The frame's height before its digest has loaded, and at least after (px). */
export const MIN_FRAME_HEIGHT = 320;

/**
 * A digest's HTML part, exactly as sent, in a frame as tall as the message: no white space under
 * a short digest, no second scroll bar in a long one. The frame is same-origin (so its height can
 * be read when it loads and when the window's width changes) but runs nothing: no scripts, and
 * the part's own Content-Security-Policy allows only its inline styles.
 */
export function DigestFrame({ src, title }: { src: string; title: string }) {
  const frame = useRef<HTMLIFrameElement>(null);
  const [height, setHeight] = useState(MIN_FRAME_HEIGHT);
  const measure = useCallback(() => {
    const body = frame.current?.contentDocument?.body;
    if (body) setHeight(Math.max(MIN_FRAME_HEIGHT, Math.ceil(body.scrollHeight)));
  }, []);
  useEffect(() => {
    window.addEventListener('resize', measure);
    return () => window.removeEventListener('resize', measure);
  }, [measure]);
  return (
    <iframe
      ref={frame}
      className="cairn-digests-frame"
      title={title}
      src={src}
      sandbox="allow-same-origin"
      onLoad={measure}
      style={{ height }}
    />
  );
}
