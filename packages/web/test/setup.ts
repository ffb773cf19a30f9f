import { cleanup, configure } from '@testing-library/react';
import { afterEach } from 'vitest';

// Routes load their pages lazily; on a busy machine the first import of a page
// takes longer than testing-library's 1 s default, which is a wait, not a defect.
configure({ asyncUtilTimeout: 5000 });

afterEach(() => {
  cleanup();
  localStorage.clear();
  document.body.className = '';
});
