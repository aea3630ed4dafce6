import { isRouteErrorResponse, Link, useRouteError } from 'react-router';
import { paths } from '../paths';

export function RouteError() {
  const error = useRouteError();
  const message = isRouteErrorResponse(error) ? `${error.status} ${error.statusText}` : error instanceof Error ? error.message : 'Unknown error';
  return (
    <main className="mx-auto max-w-lg p-8">
      <h1 className="text-xl font-semibold">This page could not be shown</h1>
      <p role="alert" className="mt-2 text-clay">{message}</p>
      <Link to={paths.home} className="mt-4 inline-block text-moss underline">Back to Lamella</Link>
    </main>
  );
}
