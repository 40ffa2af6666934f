import { h } from '../src/cells/index.js';
import { NOTEBOOKS, pageChrome } from './shared/page.js';

pageChrome('', 'strainledger notebooks');
document.getElementById('notebook-list')!.append(...NOTEBOOKS.map((n) =>
  h('li', {}, h('a', { href: n.path }, n.title), ' — ', n.blurb)));
