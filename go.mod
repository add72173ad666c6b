module assay

go 1.26.8

require (
	github.com/ALTree/bigfloat v0.0.0-20220102081255-38c8b72a9924
	github.com/chromedp/chromedp v0.23.1
	github.com/go-python/gpython v0.2.1-0.20260302130241-444ae5ed29cf
	github.com/gomarkdown/markdown v0.0.0-20261107153045-a51d70be185e
	golang.org/x/image v0.30.0
	gonum.org/v1/gonum v0.17.0
	gonum.org/v1/plot v0.17.0
)

require (
	codeberg.org/go-fonts/liberation v0.5.0 // indirect
	codeberg.org/go-latex/latex v0.2.0 // indirect
	codeberg.org/go-pdf/fpdf v0.11.1 // indirect
	git.sr.ht/~sbinet/gg v0.7.0 // indirect
	github.com/ajstarks/svgo v0.0.0-20211024235047-1546f124cd8b // indirect
	github.com/chromedp/cdproto v0.160.1 // indirect
	github.com/chzyer/readline v1.5.1 // indirect
	github.com/creack/pty v1.1.24 // indirect
	github.com/go-json-experiment/json v0.0.0-20260213210345-44df1a37e875 // indirect
	github.com/golang/freetype v0.0.0-20170609003504-e2365dfdc4a0 // indirect
	golang.org/x/sys v0.35.0 // indirect
	golang.org/x/text v0.28.0 // indirect
	golang.org/x/tools v0.36.0 // indirect
)
