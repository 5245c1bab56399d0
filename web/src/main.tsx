import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
// Fonts and KaTeX's styles are bundled with the client; nothing is fetched from the internet.
import '@fontsource/ibm-plex-sans/400.css';
import '@fontsource/ibm-plex-sans/400-italic.css';
import '@fontsource/ibm-plex-sans/500.css';
import '@fontsource/ibm-plex-sans/600.css';
import '@fontsource/jetbrains-mono/400.css';
import '@fontsource/jetbrains-mono/600.css';
import 'katex/dist/katex.min.css';
import './index.css';
import { App } from './app';

const root = document.getElementById('root');
if (!root) throw new Error('The page has no #root element to mount Modewright in.');

createRoot(root).render(
  <StrictMode>
    <App />
  </StrictMode>,
);
