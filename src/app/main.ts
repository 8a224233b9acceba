// Entry of the page: registers the components; index.html holds the <gg-app> element.
import './app.ts';
