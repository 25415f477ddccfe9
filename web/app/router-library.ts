// React Router as a start-up step of its own: web/main.tsx imports this file to run the router's
// library (its own file, vite.config.ts) in a task before the app's. It names one export rather
// than the whole package so that the build still leaves out what the app does not use.
export { createBrowserRouter } from 'react-router';
