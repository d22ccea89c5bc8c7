module vouch

go 1.26.8

require (
	github.com/expr-lang/expr v1.17.8 // indirect
	github.com/yuin/goldmark v1.8.7 // indirect
	go.yaml.in/yaml/v3 v3.0.6 // indirect
)
