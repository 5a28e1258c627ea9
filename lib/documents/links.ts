/** Where a browser opens an issued document (a session and the roles decide, see the route). */
export const documentUrl = (id: string) => `/api/documents/${id}`;
