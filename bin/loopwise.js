#!/usr/bin/env node
'use strict';
// The CLI is bundled to dist/cli.js by `npm run build` (run automatically by `npm install`).
require('../dist/cli.js');
