/** How a route that answers with a file the browser saves is described in the OpenAPI document. */

export const XLSX = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';
export const CSV = 'text/csv';
export const PDF = 'application/pdf';

/** The OpenAPI description of a file download (for `@ApiOkResponse`). */
export const fileResponse = (mediaType: string, description: string) => ({
  description,
  content: { [mediaType]: { schema: { type: 'string' as const, format: 'binary' } } },
});
