import { build, engineFor } from './bridge.js';
