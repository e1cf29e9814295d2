import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import '@fontsource/source-sans-3/400.css';
import '@fontsource/source-sans-3/600.css';
import '@fontsource/source-sans-3/700.css';
import './styles.css';
import { AppProviders } from './app/providers.tsx';

const root = document.getElementById('root');
if (!root) throw new Error('index.html lacks the #root element.');

createRoot(root).render(
  <StrictMode>
    <AppProviders />
  </StrictMode>,
);
