import { Outlet, ScrollRestoration } from 'react-router-dom';

/** The outermost route: every page, public or signed in. */
export function RootLayout() {
  return (
    <>
      <Outlet />
      <ScrollRestoration />
    </>
  );
}
