import S3rver from "s3rver";

// A local S3 fake (s3rver) on loopback for the demo and the tests: the app talks to it with
// the real S3 protocol, as it would to any S3-compatible store. Not used in production.

/** CORS for browser uploads to presigned URLs: exactly the app's origins, as S3 wants them. */
export function corsXml(origins: string[]): string {
  const rules = origins
    .map(
      (o) => `
  <CORSRule>
    <AllowedOrigin>${o}</AllowedOrigin>
    <AllowedMethod>PUT</AllowedMethod>
    <AllowedMethod>GET</AllowedMethod>
    <AllowedMethod>HEAD</AllowedMethod>
    <AllowedHeader>*</AllowedHeader>
    <ExposeHeader>ETag</ExposeHeader>
    <MaxAgeSeconds>3000</MaxAgeSeconds>
  </CORSRule>`,
    )
    .join("");
  return `<CORSConfiguration xmlns="http://s3.amazonaws.com/doc/2006-03-01/">${rules}\n</CORSConfiguration>`;
}

/** Both spellings of a loopback origin, since browsers treat them as different origins. */
export function loopbackOrigins(appUrl: string): string[] {
  const u = new URL(appUrl);
  const out = new Set([u.origin]);
  if (u.hostname === "localhost") out.add(u.origin.replace("localhost", "127.0.0.1"));
  if (u.hostname === "127.0.0.1") out.add(u.origin.replace("127.0.0.1", "localhost"));
  return [...out];
}

export async function startS3Fake(opts: {
  port: number;
  directory: string;
  bucket: string;
  appUrls: string[];
  silent?: boolean;
}): Promise<S3rver> {
  const server = new S3rver({
    address: "127.0.0.1",
    port: opts.port,
    silent: opts.silent ?? true,
    directory: opts.directory,
    configureBuckets: [{ name: opts.bucket, configs: [corsXml(opts.appUrls.flatMap(loopbackOrigins))] }],
  });
  await server.run();
  return server;
}
