/** Addresses of the dashboard's views: `/` the runs list, `/runs/<id>` one run. */

/** The run id in a `/runs/<id>` address (percent-decoded), or null for any other address. */
export function runIdOfPath(pathname: string): string | null {
  const match = /^\/runs\/([^/]+)\/?$/.exec(pathname);
  if (match?.[1] === undefined) return null;
  try {
    return decodeURIComponent(match[1]);
  } catch {
    return null; // a malformed escape is no run id
  }
}
