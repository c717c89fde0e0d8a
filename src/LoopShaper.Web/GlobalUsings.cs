global using LoopShaper.Web.Model;
