// Every feature of the server, in the order their contributions are merged. A new feature is one file here.
import type { Feature } from '../context';
import { actions } from './actions';
import { blocks } from './blocks';
import { completion } from './completion';
import { custom } from './custom';
import { definition } from './definition';
import { hover } from './hover';
import { lens } from './lens';

export const features: Feature[] = [hover, lens, actions, completion, definition, blocks, custom];
