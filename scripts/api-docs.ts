/**
 * `npm run docs:api`: writes docs/api.md from the server's own route table (method, path, who may call,
 * what it does), so the API reference never drifts from the code. A test checks it is current.
 */
import fs from 'node:fs';
import { routeTableMarkdown } from '../server/route-docs';

fs.mkdirSync('docs', { recursive: true });
fs.writeFileSync('docs/api.md', routeTableMarkdown());
console.log('docs/api.md written.');
