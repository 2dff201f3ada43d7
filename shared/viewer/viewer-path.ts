/** The viewer's address in the app, with the project and image ids captured: the server and the client's head start both recognise it. */
export const VIEWER_PATH = /^\/projects\/([^/]+)\/images\/([^/]+)\/view\/?$/;
