import { AnchorButton, type AnchorButtonProps } from '@blueprintjs/core';
import { useNavigate } from 'react-router-dom';

/** A Blueprint button that is a real link, followed inside the app (no reload). */
export function LinkButton({ to, ...props }: AnchorButtonProps & { to: string }) {
  const navigate = useNavigate();
  return (
    <AnchorButton
      role="link"
      {...props}
      href={to}
      onClick={(event) => {
        if (event.metaKey || event.ctrlKey || event.shiftKey || event.button !== 0) return;
        event.preventDefault();
        void navigate(to);
      }}
    />
  );
}
