/**
 * Setup for the client test group (jsdom). Testing Library's `findBy…`/`waitFor` give up after
 * one second by default; on a loaded two-core CI machine a first render with lazy chunks can take
 * longer than that, which made a passing test fail. Five seconds keeps a real hang visible while
 * not failing on a slow machine.
 */
import { configure } from '@testing-library/react';

configure({ asyncUtilTimeout: 5_000 });
