// Installs the Debian packages named on the command line when they are missing (as root).
import { ensureDebianPackages, type Tool } from './lib/services';

ensureDebianPackages(process.argv.slice(2) as Tool[]);
