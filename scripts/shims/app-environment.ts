// Scripts are never a build and never the browser.
export const building = false;
export const browser = false;
export const dev = false;
