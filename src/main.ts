import { bootstrapApplication } from '@angular/platform-browser';
import { App } from './app/app';
import { appConfig } from './app/app.config';
import { headStartViewer } from './app/viewer/head-start';

// Before Angular starts: a viewer link loads its code and asks for its image and first tiles now.
headStartViewer(location.pathname, { width: innerWidth, height: innerHeight, pixelRatio: devicePixelRatio || 1 });

bootstrapApplication(App, appConfig).catch((error: unknown) => console.error(error));
