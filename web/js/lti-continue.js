// A launch's page posts its one-time ticket to this origin at once; the page's button does the same without scripts.
document.querySelector('form')?.submit();
