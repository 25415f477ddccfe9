// Browser entry: self-hosted font, global styles, providers and the router.
import '@fontsource-variable/inter';
import './styles/app.css';
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { AppProvider } from './app/provider';
import { AppRouter } from './app/router';

const container = document.getElementById('root');
if (!container) throw new Error('Sheaf needs an element with id "root" in index.html');

createRoot(container).render(
  <StrictMode>
    <AppProvider>
      <AppRouter />
    </AppProvider>
  </StrictMode>,
);
