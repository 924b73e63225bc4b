// Serves the built app (`build/`), the way `npm start` and `npm run demo` do.
// adapter-node needs ORIGIN over plain http, or every form POST is refused as cross-site; an
// empty ORIGIN stops the server. Default it from PORT unless the environment gives one.
const port = process.env.PORT || '3000';
process.env.PORT = port;
if (!process.env.ORIGIN) process.env.ORIGIN = `http://localhost:${port}`;
if (!process.env.NODE_ENV) process.env.NODE_ENV = 'production';

await import('../build/index.js');
console.log(`Twelvefold is serving on ${process.env.ORIGIN}`);
