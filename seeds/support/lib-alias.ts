// Registers the `$lib/…` alias for modules imported after this one (dynamic imports), so that
// seeds can call the app's entity modules, which import each other through the alias.
import { register } from 'node:module';

register('./lib-alias-hooks.mjs', import.meta.url);
