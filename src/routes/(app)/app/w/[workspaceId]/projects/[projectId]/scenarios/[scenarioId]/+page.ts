/**
 * The editor renders in the browser only. It is an application rather than
 * a document: every figure on it comes from the evaluate route after load,
 * and rendering its hundred-odd fields on the server made each view cost
 * the server as much as twenty other pages (`npm run bench:http`). The
 * server still checks access and sends the saved scenario (+page.server.ts).
 */
export const ssr = false;
