let publicUrl = '';

/** The product's public address, for links in e-mail (set once when the app is built). */
export function configureLinks(url: string): void {
  publicUrl = url.replace(/\/+$/, '');
}

export function linkTo(path: string): string {
  return `${publicUrl}${path}`;
}
