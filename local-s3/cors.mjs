// @ts-check
/**
 * Bucket CORS: the app's origins may PUT, GET and HEAD directly, and read the ETag.
 * @param {string[]} origins
 */
export function corsConfiguration(origins) {
  const rules = origins
    .map(
      (origin) => `  <CORSRule>
    <AllowedOrigin>${origin}</AllowedOrigin>
    <AllowedMethod>PUT</AllowedMethod>
    <AllowedMethod>GET</AllowedMethod>
    <AllowedMethod>HEAD</AllowedMethod>
    <AllowedHeader>*</AllowedHeader>
    <ExposeHeader>ETag</ExposeHeader>
    <MaxAgeSeconds>3000</MaxAgeSeconds>
  </CORSRule>`,
    )
    .join('\n');
  return `<CORSConfiguration>\n${rules}\n</CORSConfiguration>`;
}
