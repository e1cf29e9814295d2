import { cleanup } from '@testing-library/react';
import { afterEach } from 'vitest';

// Each test starts from an empty page, cookie jar and storage (drafts live in localStorage).
afterEach(() => {
  cleanup();
  localStorage.clear();
  document.cookie.split('; ').forEach((c) => {
    const name = c.split('=')[0];
    if (name) document.cookie = `${name}=; expires=Thu, 01 Jan 1970 00:00:00 GMT; path=/`;
  });
});
